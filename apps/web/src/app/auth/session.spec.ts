import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { userWithRole } from '../testing/user-fixtures';
import { Session } from './session';

describe('Session', () => {
  let session: Session;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    session = TestBed.inject(Session);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('restores the user from GET /api/auth/me', async () => {
    const restored = session.restore();
    http.expectOne('/api/auth/me').flush({ user: userWithRole('risk_manager') });
    expect((await restored)?.email).toBe('risk@demo.test');
    expect(session.isSignedIn()).toBe(true);
    expect(session.role()).toBe('risk_manager');
  });

  it('treats a 401 from /api/auth/me as signed out', async () => {
    const restored = session.restore();
    http
      .expectOne('/api/auth/me')
      .flush({ error: { code: 'unauthenticated', message: 'Sign in.' } }, {
        status: 401,
        statusText: 'Unauthorized',
      });
    expect(await restored).toBeNull();
    expect(session.isSignedIn()).toBe(false);
  });

  it('asks the server once for concurrent and later restores', async () => {
    const first = session.restore();
    const second = session.restore();
    http.expectOne('/api/auth/me').flush({ user: userWithRole('viewer') });
    await Promise.all([first, second]);
    expect((await session.restore())?.role).toBe('viewer');
    http.expectNone('/api/auth/me');
  });

  it('answers hasRole from the signed-in user and forgets it on clear', () => {
    session.signIn(userWithRole('plant_manager'));
    expect(session.hasRole('plant_manager')).toBe(true);
    expect(session.hasRole('admin', 'buyer')).toBe(false);
    session.clear();
    expect(session.hasRole('plant_manager')).toBe(false);
    expect(session.user()).toBeNull();
  });

  it('does not ask the server after a sign-in', async () => {
    session.signIn(userWithRole('buyer'));
    expect((await session.restore())?.role).toBe('buyer');
    http.expectNone('/api/auth/me');
  });
});
