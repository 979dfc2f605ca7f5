import { ROLES } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { NAVIGATION } from '../shell/navigation';
import { ROLE_GUIDES, greetingFor } from './role-guide';

describe('ROLE_GUIDES', () => {
  it('explains every role in one sentence and gives it at least one task', () => {
    for (const role of ROLES) {
      const guide = ROLE_GUIDES[role];
      expect(guide.summary.trim().endsWith('.')).toBe(true);
      expect(guide.summary.split(/[.!?](\s|$)/).filter((part) => part.trim()).length).toBe(1);
      expect(guide.tasks.length).toBeGreaterThan(0);
    }
  });

  it('links only to pages the role can open (no dead links)', () => {
    for (const role of ROLES) {
      for (const task of ROLE_GUIDES[role].tasks) {
        if (!task.link) {
          continue;
        }
        const entry = NAVIGATION.find((candidate) => `/${candidate.path}` === task.link!.path);
        expect(entry, `${role}: ${task.link.path}`).toBeDefined();
        expect((entry!.roles as readonly string[]).includes(role)).toBe(true);
      }
    }
  });

  it("tells the buyer that importing is still to come", () => {
    const emptyStates = ROLE_GUIDES.buyer.tasks.map((task) => task.emptyState);
    expect(emptyStates).toContain('No network imported yet — importing arrives soon.');
  });
});

describe('greetingFor', () => {
  it('greets by part of the day', () => {
    expect(greetingFor(0)).toBe('Good morning');
    expect(greetingFor(11)).toBe('Good morning');
    expect(greetingFor(12)).toBe('Good afternoon');
    expect(greetingFor(17)).toBe('Good afternoon');
    expect(greetingFor(18)).toBe('Good evening');
    expect(greetingFor(23)).toBe('Good evening');
  });

  it('refuses an hour outside 0-23, naming it', () => {
    expect(() => greetingFor(24)).toThrow(/got 24/);
    expect(() => greetingFor(1.5)).toThrow(RangeError);
  });
});
