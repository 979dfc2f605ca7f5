import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import {
  type ActivatedRouteSnapshot,
  type CanActivateFn,
  Router,
  type RouterStateSnapshot,
  type UrlTree,
  provideRouter,
  withComponentInputBinding,
} from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@keelson/contracts';
import { beforeEach, describe, expect, it } from 'vitest';
import { routes } from '../app.routes';
import { userWithRole } from '../testing/user-fixtures';
import { apiInterceptor } from './api-interceptor';
import { roleGuard, signedInGuard, signedOutGuard } from './auth-guard';
import { Session } from './session';

function runGuard(guard: CanActivateFn, url: string): Promise<boolean | UrlTree> {
  const state = { url } as RouterStateSnapshot;
  return TestBed.runInInjectionContext(
    () => guard({} as ActivatedRouteSnapshot, state) as Promise<boolean | UrlTree>,
  );
}

function asUrl(result: boolean | UrlTree): string {
  return typeof result === 'boolean' ? String(result) : TestBed.inject(Router).serializeUrl(result);
}

describe('guards', () => {
  let session: Session;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    session = TestBed.inject(Session);
  });

  it('signedInGuard sends a signed-out visitor to sign-in with the return address', async () => {
    session.clear();
    expect(asUrl(await runGuard(signedInGuard, '/admin/users'))).toBe(
      '/sign-in?returnUrl=%2Fadmin%2Fusers',
    );
  });

  it('signedInGuard lets a signed-in person through', async () => {
    session.signIn(userWithRole('viewer'));
    expect(await runGuard(signedInGuard, '/home')).toBe(true);
  });

  it('signedOutGuard sends a signed-in person home instead of to sign-in', async () => {
    session.signIn(userWithRole('buyer'));
    expect(asUrl(await runGuard(signedOutGuard, '/sign-in'))).toBe('/home');
  });

  it('roleGuard refuses another role with the forbidden page naming the address', async () => {
    session.signIn(userWithRole('buyer'));
    expect(asUrl(await runGuard(roleGuard('admin'), '/admin/users'))).toBe(
      '/forbidden?page=%2Fadmin%2Fusers',
    );
  });

  it('roleGuard lets an allowed role through', async () => {
    session.signIn(userWithRole('risk_manager'));
    expect(await runGuard(roleGuard('admin', 'risk_manager'), '/somewhere')).toBe(true);
  });

  it('roleGuard sends a signed-out visitor to sign-in with the return address', async () => {
    session.clear();
    expect(asUrl(await runGuard(roleGuard('admin'), '/admin/mail'))).toBe(
      '/sign-in?returnUrl=%2Fadmin%2Fmail',
    );
  });

  it('roleGuard without roles is refused when declared', () => {
    expect(() => roleGuard()).toThrow(/at least one role/);
  });
});

describe('the app routes with their guards', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter(routes, withComponentInputBinding()),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
  });

  async function navigateAs(role: Role | null, url: string): Promise<string> {
    const session = TestBed.inject(Session);
    if (role) {
      session.signIn(userWithRole(role));
    } else {
      session.clear();
    }
    const harness = await RouterTestingHarness.create();
    // The pages' own data requests stay unanswered: only where the router lands matters here.
    await harness.navigateByUrl(url);
    return TestBed.inject(Router).url;
  }

  it('redirects a signed-out visitor of /admin/users to sign-in with returnUrl', async () => {
    expect(await navigateAs(null, '/admin/users')).toBe('/sign-in?returnUrl=%2Fadmin%2Fusers');
  });

  it('refuses Users to a buyer with the forbidden page', async () => {
    expect(await navigateAs('buyer', '/admin/users')).toBe('/forbidden?page=%2Fadmin%2Fusers');
  });

  it('refuses Sent mail to a plant manager with the forbidden page', async () => {
    expect(await navigateAs('plant_manager', '/admin/mail')).toBe(
      '/forbidden?page=%2Fadmin%2Fmail',
    );
  });

  it('opens Users for an administrator', async () => {
    expect(await navigateAs('admin', '/admin/users')).toBe('/admin/users');
  });

  it('opens home for a viewer at the root address', async () => {
    expect(await navigateAs('viewer', '/')).toBe('/home');
  });
});
