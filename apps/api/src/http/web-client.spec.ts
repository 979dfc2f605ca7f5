import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';

let webRoot: string;
let built: TestApp;
let missing: TestApp;

beforeAll(async () => {
  webRoot = mkdtempSync(join(tmpdir(), 'keelson-web-'));
  mkdirSync(join(webRoot, 'media'));
  writeFileSync(join(webRoot, 'index.html'), '<!doctype html><title>Keelson shell</title>');
  writeFileSync(join(webRoot, 'main-ABC.js'), 'console.log("client")');
  built = await createTestApp({ webRoot });
  missing = await createTestApp({ webRoot: join(webRoot, 'absent') });
});
afterAll(async () => {
  await built.close();
  await missing.close();
  rmSync(webRoot, { recursive: true, force: true });
});

describe('the web client', () => {
  it('serves built files as they are', async () => {
    const response = await request(built.app).get('/main-ABC.js');
    expect(response.status).toBe(200);
    expect(response.text).toContain('client');
  });

  it.each(['/', '/sign-in', '/admin/users?tab=2', '/deep/link/to/a/plan'])(
    'answers the client route %s with index.html',
    async (path) => {
      const response = await request(built.app).get(path);
      expect(response.status).toBe(200);
      expect(response.text).toContain('Keelson shell');
      expect(response.headers['cache-control']).toBe('no-cache');
    },
  );

  it('keeps unknown /api paths as JSON 404, not the shell', async () => {
    const response = await request(built.app).get('/api/unknown');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('says so in a plain page when the build is missing', async () => {
    const response = await request(missing.app).get('/sign-in');
    expect(response.status).toBe(503);
    expect(response.headers['content-type']).toMatch(/html/);
    expect(response.text).toContain('npm run build:web');
  });
});
