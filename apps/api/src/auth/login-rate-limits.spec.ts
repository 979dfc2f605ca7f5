import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '@keelson/contracts';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp | undefined;
afterEach(async () => {
  await t?.close();
  t = undefined;
});

function login(app: TestApp, email: string, password: string) {
  return request(app.app)
    .post('/api/auth/login')
    .set(CSRF_HEADER, '1')
    .send({ email, password });
}

describe('sign-in rate limits', () => {
  it('answers 429 with the error body once an account has too many failures', async () => {
    t = await createTestApp({ rateLimits: { failuresPerAccount: 3, perAddress: 100 } });
    for (let attempt = 0; attempt < 3; attempt += 1) {
      expect((await login(t, 'risk@demo.test', 'wrong')).status).toBe(401);
    }
    const blocked = await login(t, 'Risk@demo.test', 'keelson-demo');
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_requests');
    expect(blocked.body.error.message).toMatch(/this account/);
    // Another account from the same address is still served.
    expect((await login(t, 'buyer@demo.test', 'keelson-demo')).status).toBe(200);
  });

  it('does not count successful sign-ins against the account', async () => {
    t = await createTestApp({ rateLimits: { failuresPerAccount: 2, perAddress: 100 } });
    for (let attempt = 0; attempt < 4; attempt += 1) {
      expect((await login(t, 'viewer@demo.test', 'keelson-demo')).status).toBe(200);
    }
    expect((await login(t, 'viewer@demo.test', 'wrong')).status).toBe(401);
  });

  it('limits all sign-ins from one address', async () => {
    t = await createTestApp({ rateLimits: { failuresPerAccount: 100, perAddress: 4 } });
    for (let attempt = 0; attempt < 4; attempt += 1) {
      await login(t, `user${attempt}@demo.test`, 'wrong');
    }
    const blocked = await login(t, 'admin@demo.test', 'keelson-demo');
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.message).toMatch(/your address/);
    expect(blocked.headers.ratelimit).toBeDefined();
  });
});
