import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPOSITORY_ROOT } from '../config/app-config';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/health', () => {
  it('answers ok, the database state, version and mode without a session', async () => {
    const version = JSON.parse(readFileSync(`${REPOSITORY_ROOT}/package.json`, 'utf8')).version;
    const response = await request(t.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok', db: 'ok', version, mode: 'test' });
  });

  it('answers 503 with db error once the database is gone', async () => {
    const broken = await createTestApp();
    broken.database.close();
    try {
      const response = await request(broken.app).get('/api/health');
      expect(response.status).toBe(503);
      expect(response.body).toMatchObject({ status: 'error', db: 'error' });
    } finally {
      await broken.close();
    }
  });
});
