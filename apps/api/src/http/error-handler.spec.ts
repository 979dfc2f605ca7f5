import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { createTestApp, type TestApp } from '../testing/test-app';
import { AppError } from './app-error';
import { apiNotFoundHandler, errorHandler } from './error-handler';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A small app whose routes throw each kind of error the handler maps. */
function throwingApp() {
  const app = express();
  app.use(express.json({ limit: '1kb' }));
  app.get('/app-error', () => {
    throw new AppError('plan_locked', 409, 'The plan is locked.', { planId: 7 });
  });
  app.get('/zod', () => {
    z.object({ count: z.number() }).parse({ count: 'three' });
  });
  app.get('/crash', () => {
    throw new Error('secret internal detail at /srv/keelson');
  });
  app.get('/async-crash', async () => {
    await Promise.resolve();
    throw new TypeError('undefined is not a function');
  });
  app.post('/echo', (req, res) => res.json(req.body));
  app.use(apiNotFoundHandler);
  app.use(errorHandler);
  return app;
}

describe('the central error handler', () => {
  it('sends an AppError as {error: {code, message, details}} with its status', async () => {
    const response = await request(throwingApp()).get('/app-error');
    expect(response.status).toBe(409);
    expect(response.body).toEqual({
      error: { code: 'plan_locked', message: 'The plan is locked.', details: { planId: 7 } },
    });
  });

  it('turns a zod error into 400 invalid_request with the issue paths', async () => {
    const response = await request(throwingApp()).get('/zod');
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_request');
    expect(response.body.error.details.issues[0].path).toBe('count');
  });

  it.each(['/crash', '/async-crash'])(
    'answers 500 internal for %s with no stack and no internal message',
    async (path) => {
      const response = await request(throwingApp()).get(path);
      expect(response.status).toBe(500);
      expect(response.body).toEqual({
        error: {
          code: 'internal',
          message: 'Something went wrong on the server. Please try again.',
        },
      });
      expect(response.text).not.toMatch(/secret|at |\.ts|TypeError/);
    },
  );

  it('maps malformed and oversized JSON bodies', async () => {
    const malformed = await request(throwingApp())
      .post('/echo')
      .set('Content-Type', 'application/json')
      .send('{"open": ');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.code).toBe('invalid_json');
    expect(malformed.text).not.toMatch(/SyntaxError|at /);
    const large = await request(throwingApp())
      .post('/echo')
      .send({ text: 'x'.repeat(2048) });
    expect(large.status).toBe(413);
    expect(large.body.error.code).toBe('payload_too_large');
  });
});

describe('the real app', () => {
  it('answers unknown /api paths with 404 not_found JSON naming the path', async () => {
    const response = await request(t.app).get('/api/no/such/thing?x=1');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(/json/);
    expect(response.body).toEqual({
      error: { code: 'not_found', message: 'There is no GET /api/no/such/thing in the API.' },
    });
    const post = await request(t.app).post('/api/users/1/nothing');
    expect(post.status).toBe(404);
  });

  it('refuses a JSON body over 1 MB with 413', async () => {
    const response = await request(t.app)
      .post('/api/auth/login')
      .set('x-keelson-csrf', '1')
      .send({ email: 'a@b.test', password: 'x'.repeat(1_100_000) });
    expect(response.status).toBe(413);
  });

  it('echoes a valid X-Request-Id and makes a UUID otherwise', async () => {
    const given = await request(t.app).get('/api/health').set('X-Request-Id', 'trace-42');
    expect(given.headers['x-request-id']).toBe('trace-42');
    const made = await request(t.app)
      .get('/api/health')
      .set('X-Request-Id', 'has spaces {and} braces');
    expect(made.headers['x-request-id']).toMatch(
      /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/,
    );
  });

  it('sends security headers with a self-only Content-Security-Policy', async () => {
    const response = await request(t.app).get('/api/health');
    const policy = response.headers['content-security-policy'];
    expect(policy).toContain("default-src 'self'");
    expect(policy).toContain("script-src 'self'");
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).not.toMatch(/https:|fonts\.googleapis/);
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-frame-options']).toBe('DENY');
    expect(response.headers['x-powered-by']).toBeUndefined();
    // Plain http: no HSTS.
    expect(response.headers['strict-transport-security']).toBeUndefined();
  });
});
