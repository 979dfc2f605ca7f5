import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, type UrlTree, provideRouter } from '@angular/router';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { userWithRole } from '../testing/user-fixtures';
import { apiInterceptor, isApiRequest } from './api-interceptor';
import { Session } from './session';

const UNAUTHORIZED = { status: 401, statusText: 'Unauthorized' };
const EXPIRED = { error: { code: 'unauthenticated', message: 'Your session has ended.' } };

describe('apiInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let session: Session;
  let router: Router;
  let navigateByUrl: ReturnType<typeof vi.spyOn>;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    session = TestBed.inject(Session);
    router = TestBed.inject(Router);
    navigateByUrl = vi.spyOn(router, 'navigateByUrl').mockResolvedValue(true);
    vi.spyOn(router, 'url', 'get').mockReturnValue('/admin/users?q=pia');
  });

  afterEach(() => backend.verify());

  it('adds the CSRF header and credentials to every /api request', () => {
    http.post('/api/users/invitations', {}).subscribe();
    http.get('/api/plants').subscribe();
    for (const url of ['/api/users/invitations', '/api/plants']) {
      const request = backend.expectOne(url).request;
      expect(request.headers.get(CSRF_HEADER)).toBe(CSRF_HEADER_VALUE);
      expect(request.withCredentials).toBe(true);
      backend.expectNone(url);
    }
  });

  it('leaves requests to other addresses alone', () => {
    http.get('/assets/logo.svg', { responseType: 'text' }).subscribe();
    const pending = backend.expectOne('/assets/logo.svg');
    expect(pending.request.headers.has(CSRF_HEADER)).toBe(false);
    expect(pending.request.withCredentials).toBe(false);
    pending.flush('');
  });

  it('on a 401 clears the session and sends the person to sign-in with returnUrl', () => {
    session.signIn(userWithRole('admin'));
    let status = 0;
    http.get('/api/users').subscribe({
      error: (error: { status: number }) => (status = error.status),
    });
    backend.expectOne('/api/users').flush(EXPIRED, UNAUTHORIZED);

    expect(status).toBe(401);
    expect(session.user()).toBeNull();
    expect(navigateByUrl).toHaveBeenCalledTimes(1);
    const target = navigateByUrl.mock.calls[0]![0] as UrlTree;
    expect(router.serializeUrl(target)).toBe('/sign-in?returnUrl=%2Fadmin%2Fusers%3Fq%3Dpia');
  });

  it('does not redirect on a 401 from /api/auth/me (that only means "not signed in")', () => {
    http.get('/api/auth/me').subscribe({ error: () => undefined });
    backend.expectOne('/api/auth/me').flush(EXPIRED, UNAUTHORIZED);
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it('does not redirect on a 401 from login (wrong credentials) and passes the error on', () => {
    session.signIn(userWithRole('buyer'));
    let message = '';
    http.post('/api/auth/login', {}).subscribe({
      error: (error: { error: typeof EXPIRED }) => (message = error.error.error.message),
    });
    backend.expectOne('/api/auth/login').flush(EXPIRED, UNAUTHORIZED);
    expect(message).toBe('Your session has ended.');
    expect(navigateByUrl).not.toHaveBeenCalled();
    expect(session.user()?.role).toBe('buyer');
  });

  it('leaves the session alone on other errors (403, 500)', () => {
    session.signIn(userWithRole('viewer'));
    http.get('/api/users').subscribe({ error: () => undefined });
    backend.expectOne('/api/users').flush(EXPIRED, { status: 403, statusText: 'Forbidden' });
    expect(session.user()).not.toBeNull();
    expect(navigateByUrl).not.toHaveBeenCalled();
  });
});

describe('isApiRequest', () => {
  it('matches /api and paths below it, not look-alikes', () => {
    expect(isApiRequest('/api/users')).toBe(true);
    expect(isApiRequest('/api?x=1')).toBe(true);
    expect(isApiRequest('/apix/users')).toBe(false);
    expect(isApiRequest('https://elsewhere.test/api/users')).toBe(false);
  });
});
