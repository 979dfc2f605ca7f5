import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, SESSION_COOKIE } from '@keelson/contracts';
import { createTestApp, type TestApp } from '../testing/test-app';
import { LOGIN_REFUSED_MESSAGE } from './auth.service';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
  // An invited user who has not set a password yet, and a deactivated one.
  t.database.sqlite
    .prepare(
      `insert into users (email, name, role, password_hash, is_active, created_at, updated_at)
       values ('invited@demo.test', 'Ivo Invited', 'viewer', null, 1, 'x', 'x')`,
    )
    .run();
  t.database.sqlite
    .prepare(
      `insert into users (email, name, role, password_hash, is_active, created_at, updated_at)
       select 'gone@demo.test', 'Gina Gone', 'buyer', password_hash, 0, 'x', 'x'
       from users where email = 'buyer@demo.test'`,
    )
    .run();
});
afterAll(() => t.close());

function login(body: object) {
  return request(t.app).post('/api/auth/login').set(CSRF_HEADER, '1').send(body);
}

describe('POST /api/auth/login', () => {
  it('signs in with the demo password, answers user and token, sets the cookie', async () => {
    const response = await login({ email: ' Risk@Demo.test ', password: 'keelson-demo' });
    expect(response.status).toBe(200);
    expect(response.body.user).toMatchObject({ email: 'risk@demo.test', role: 'risk_manager' });
    expect(response.body.user.passwordHash).toBeUndefined();
    expect(response.body.user.lastLoginAt).toBe(t.clock.now.toISOString());
    const cookie: string = response.headers['set-cookie'][0];
    expect(cookie).toContain(`${SESSION_COOKIE}=${response.body.token}`);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Strict/);
    expect(cookie).toMatch(/Path=\//);
    expect(cookie).not.toMatch(/Secure/);
    // jsonwebtoken decodes the header: HS256, 8 hours, sub and role claims.
    const decoded = jwt.decode(response.body.token, { complete: true })!;
    expect(decoded.header.alg).toBe('HS256');
    const payload = decoded.payload as jwt.JwtPayload;
    expect(payload.role).toBe('risk_manager');
    expect(payload.sub).toBe(String(t.userId('risk@demo.test')));
    expect(payload.exp! - payload.iat!).toBe(8 * 3600);
  });

  it.each([
    ['a wrong password', { email: 'risk@demo.test', password: 'not-it' }],
    ['an unknown e-mail', { email: 'nobody@demo.test', password: 'keelson-demo' }],
    ['a deactivated account', { email: 'gone@demo.test', password: 'keelson-demo' }],
    ['an account without a password yet', { email: 'invited@demo.test', password: 'x' }],
  ])('refuses %s with the same 401 message and no cookie', async (_case, body) => {
    const response = await login(body);
    expect(response.status).toBe(401);
    expect(response.body).toEqual({
      error: { code: 'login_refused', message: LOGIN_REFUSED_MESSAGE },
    });
    expect(response.headers['set-cookie']).toBeUndefined();
  });

  it('refuses a sign-in without the CSRF header', async () => {
    const response = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'risk@demo.test', password: 'keelson-demo' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_missing');
  });

  it('answers 400 naming the field for a malformed body', async () => {
    const response = await login({ email: 'not-an-address', password: '' });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_request');
    const paths = response.body.error.details.issues.map((issue: { path: string }) => issue.path);
    expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.password']));
  });

  it('marks the cookie Secure when the public address is https', async () => {
    const secure = await createTestApp({ publicUrl: 'https://keelson.example' });
    try {
      const response = await request(secure.app)
        .post('/api/auth/login')
        .set(CSRF_HEADER, '1')
        .send({ email: 'viewer@demo.test', password: 'keelson-demo' });
      expect(response.headers['set-cookie'][0]).toMatch(/; Secure/);
    } finally {
      await secure.close();
    }
  });
});

describe('sessions', () => {
  it('answers /me for the cookie and for a Bearer token', async () => {
    const cookie = await t.signIn('viewer@demo.test');
    const byCookie = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(byCookie.status).toBe(200);
    expect(byCookie.body.user.email).toBe('viewer@demo.test');
    const byBearer = await request(t.app)
      .get('/api/auth/me')
      .set('Authorization', `Bearer ${t.tokenFor('buyer@demo.test')}`);
    expect(byBearer.body.user.email).toBe('buyer@demo.test');
  });

  it('answers 401 without a session', async () => {
    const response = await request(t.app).get('/api/auth/me');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthenticated');
  });

  it('refuses an expired token', async () => {
    const expired = jwt.sign({ role: 'admin' }, t.config.jwtSecret, {
      algorithm: 'HS256',
      subject: String(t.userId('admin@demo.test')),
      expiresIn: -10,
    });
    const response = await request(t.app)
      .get('/api/auth/me')
      .set('Authorization', `Bearer ${expired}`);
    expect(response.status).toBe(401);
    expect(response.body.error.message).toMatch(/session has ended/);
  });

  it('refuses a tampered token (role changed, signature kept)', async () => {
    const [header, , signature] = t.tokenFor('viewer@demo.test').split('.');
    const forged = Buffer.from(
      JSON.stringify({ sub: String(t.userId('viewer@demo.test')), role: 'admin' }),
    ).toString('base64url');
    const response = await request(t.app)
      .get('/api/users')
      .set('Authorization', `Bearer ${header}.${forged}.${signature}`);
    expect(response.status).toBe(401);
  });

  it('refuses a token signed with another secret or the none algorithm', async () => {
    const id = String(t.userId('admin@demo.test'));
    const otherSecret = jwt.sign({ role: 'admin' }, 'x'.repeat(40), { subject: id });
    const unsigned = jwt.sign({ role: 'admin' }, null, { algorithm: 'none', subject: id });
    for (const token of [otherSecret, unsigned]) {
      const response = await request(t.app)
        .get('/api/auth/me')
        .set('Authorization', `Bearer ${token}`);
      expect(response.status).toBe(401);
    }
  });

  it('refuses a valid token of a user deactivated since', async () => {
    const token = t.tokenFor('risk@demo.test');
    const id = t.userId('risk@demo.test');
    t.database.sqlite.prepare('update users set is_active = 0 where id = ?').run(id);
    try {
      const response = await request(t.app)
        .get('/api/auth/me')
        .set('Authorization', `Bearer ${token}`);
      expect(response.status).toBe(401);
    } finally {
      t.database.sqlite.prepare('update users set is_active = 1 where id = ?').run(id);
    }
  });

  it('lets a Bearer request change state without the CSRF header', async () => {
    const response = await request(t.app)
      .post(`/api/users/${t.userId('viewer@demo.test')}/invitations`)
      .set('Authorization', `Bearer ${t.tokenFor('admin@demo.test')}`);
    // 409: the viewer already has a password; the point is that CSRF did not refuse it.
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('already_active');
  });

  it('refuses a cookie request that changes state without the CSRF header', async () => {
    const cookie = await t.signIn('admin@demo.test');
    const response = await request(t.app)
      .patch(`/api/users/${t.userId('viewer@demo.test')}`)
      .set('Cookie', cookie)
      .send({ name: 'Vera N.' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_missing');
    const withHeader = await request(t.app)
      .patch(`/api/users/${t.userId('viewer@demo.test')}`)
      .set(t.cookieHeaders(cookie))
      .send({ name: 'Vera Novak' });
    expect(withHeader.status).toBe(200);
  });

  it('signs out: 204 and the cookie cleared', async () => {
    const cookie = await t.signIn('viewer@demo.test');
    const response = await request(t.app).post('/api/auth/logout').set(t.cookieHeaders(cookie));
    expect(response.status).toBe(204);
    expect(response.headers['set-cookie'][0]).toMatch(
      new RegExp(`^${SESSION_COOKIE}=;.*Expires=Thu, 01 Jan 1970`),
    );
  });
});
