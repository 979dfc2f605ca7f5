import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import { ROLES, type Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { Shell } from './shell';

// What each role's sidenav shows, written out from the product brief.
const EXPECTED_LINKS: Record<Role, string[]> = {
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

describe('Shell', () => {
  let fixture: ComponentFixture<Shell>;
  let backend: HttpTestingController;

  async function render(role: Role): Promise<HTMLElement> {
    TestBed.inject(Session).signIn(userWithRole(role));
    fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [Shell],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  for (const role of ROLES) {
    it(`shows the ${role} exactly its links in the Main navigation`, async () => {
      const root = await render(role);
      const navigation = root.querySelector('[role="navigation"][aria-label="Main"]')!;
      const links = [...navigation.querySelectorAll('a')].map((link) => link.textContent?.trim());
      // The icon ligature is aria-hidden; the visible title is the link's accessible name.
      const titles = [...navigation.querySelectorAll('a [matlistitemtitle]')].map((title) =>
        title.textContent?.trim(),
      );
      expect(titles).toEqual(EXPECTED_LINKS[role]);
      expect(links).toHaveLength(EXPECTED_LINKS[role].length);
    });
  }

  it('has a skip link and a focusable main region for keyboard users', async () => {
    const root = await render('viewer');
    const skip = root.querySelector<HTMLAnchorElement>('a.kl-skip-link')!;
    expect(skip.textContent?.trim()).toBe('Skip to content');
    const main = root.querySelector<HTMLElement>('main#main-content')!;
    expect(main.tabIndex).toBe(-1);
    skip.click();
    expect(document.activeElement).toBe(main);
  });

  it('signs out: tells the server, forgets the user and goes to sign-in', async () => {
    const navigateByUrl = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    const root = await render('admin');
    root.querySelector<HTMLButtonElement>('.shell__user-button')!.click();
    await fixture.whenStable();
    const menu = document.querySelector('.mat-mdc-menu-panel')!;
    expect(menu.textContent).toContain('Administrator');
    expect(menu.textContent).toContain('admin@demo.test');
    const signOut = [...menu.querySelectorAll<HTMLButtonElement>('button')].find((button) =>
      button.textContent?.includes('Sign out'),
    )!;
    signOut.click();
    const logout = backend.expectOne('/api/auth/logout');
    expect(logout.request.method).toBe('POST');
    logout.flush(null, { status: 204, statusText: 'No Content' });
    expect(TestBed.inject(Session).user()).toBeNull();
    expect(navigateByUrl).toHaveBeenCalledWith('/sign-in');
  });
});
