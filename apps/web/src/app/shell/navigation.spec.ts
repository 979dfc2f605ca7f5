import { ROLES, type Role } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import {
  NAVIGATION,
  type NavigationPath,
  activeNavigationPath,
  navigationFor,
  rolesFor,
} from './navigation';

// Expected entries per role, written out by hand from the product brief (Home and Network for
// all; Import for buyers and administrators; Approvals for those who decide on or draft plans;
// My tasks and E-mail settings for all; the admin pages for administrators),
// not derived from NAVIGATION itself.
const EXPECTED: Record<Role, string[]> = {
  admin: ['Home', 'Import', 'Network', 'Analysis runs', 'Scenarios', 'Network picture',
    'Risk register', 'Quarterly re-scoring', 'Approvals', 'My tasks', 'E-mail settings',
    'Users', 'Sent mail', 'Countries', 'Scoring', 'Audit trail'],
  buyer: ['Home', 'Import', 'Network', 'Analysis runs', 'Scenarios', 'Network picture',
    'Risk register', 'Quarterly re-scoring', 'My tasks', 'E-mail settings'],
  risk_manager: ['Home', 'Network', 'Analysis runs', 'Scenarios', 'Network picture',
    'Risk register', 'Quarterly re-scoring', 'Approvals', 'My tasks', 'E-mail settings'],
  plant_manager: ['Home', 'Network', 'Analysis runs', 'Scenarios', 'Network picture',
    'Risk register', 'Quarterly re-scoring', 'Approvals', 'My tasks', 'E-mail settings'],
  viewer: ['Home', 'Network', 'Analysis runs', 'Scenarios', 'Network picture',
    'Risk register', 'Quarterly re-scoring', 'My tasks', 'E-mail settings'],
};

describe('navigationFor', () => {
  for (const role of ROLES) {
    it(`shows the ${role} exactly its entries, in order`, () => {
      expect(navigationFor(role).map((entry) => entry.label)).toEqual(EXPECTED[role]);
    });
  }

  it('shows nothing to a signed-out visitor', () => {
    expect(navigationFor(null)).toEqual([]);
  });
});

describe('NAVIGATION', () => {
  it('has unique paths without a leading slash and at least one role per entry', () => {
    const paths = NAVIGATION.map((entry) => entry.path);
    expect(new Set(paths).size).toBe(paths.length);
    for (const entry of NAVIGATION) {
      expect(entry.path.startsWith('/')).toBe(false);
      expect(entry.roles.length).toBeGreaterThan(0);
    }
  });
});

describe('rolesFor', () => {
  it('gives the roles of an entry', () => {
    expect(rolesFor('admin/users')).toEqual(['admin']);
    expect([...rolesFor('home')].sort()).toEqual([...ROLES].sort());
  });

  it('throws, naming the path, for a path with no entry', () => {
    expect(() => rolesFor('nowhere' as NavigationPath)).toThrow(/no entry for path "nowhere"/);
  });
});

describe('activeNavigationPath', () => {
  const entries = navigationFor('admin');
  it('picks the longest entry the URL lies under', () => {
    expect(activeNavigationPath(entries, '/runs/scenarios')).toBe('runs/scenarios');
    expect(activeNavigationPath(entries, '/runs/7?sort=rank')).toBe('runs');
    expect(activeNavigationPath(entries, '/runs')).toBe('runs');
    expect(activeNavigationPath(entries, '/admin/users')).toBe('admin/users');
    expect(activeNavigationPath(entries, '/risk')).toBe('risk');
  });
  it('gives a run\'s supplier risk page to the runs, though it lives under /risk', () => {
    expect(activeNavigationPath(entries, '/risk/3/suppliers/S-1')).toBe('runs');
  });
  it('does not take a path that only starts with the same letters, nor an unknown one', () => {
    expect(activeNavigationPath(entries, '/runsheet')).toBeNull();
    expect(activeNavigationPath(entries, '/nowhere')).toBeNull();
  });
});
