import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { mailMessages, users } from '@keelson/db';
import { ConfigError } from './config/app-config';
import { startServer } from './server';

const folders: string[] = [];
afterAll(() => folders.forEach((folder) => rmSync(folder, { recursive: true, force: true })));

function dataFolder(): string {
  const folder = mkdtempSync(join(tmpdir(), 'keelson-server-'));
  folders.push(folder);
  return folder;
}

describe('startServer', () => {
  it('starts a seeded demo server on a free port, serves sign-in, and stops', async () => {
    const folder = dataFolder();
    let hookCalls = 0;
    const server = await startServer({
      env: {},
      mode: 'demo',
      port: 0,
      host: '127.0.0.1',
      databasePath: join(folder, 'keelson.db'),
      logLevel: 'silent',
      afterSeed: () => {
        hookCalls += 1;
      },
    });
    try {
      expect(server.port).toBeGreaterThan(0);
      expect(server.config.publicUrl).toBe(`http://127.0.0.1:${server.port}`);
      expect(server.mailSink).not.toBeNull();
      expect(hookCalls).toBe(1);
      const health = await fetch(`${server.url}/api/health`);
      expect(await health.json()).toMatchObject({ status: 'ok', mode: 'demo' });
      const login = await fetch(`${server.url}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-keelson-csrf': '1' },
        body: JSON.stringify({ email: 'admin@demo.test', password: 'keelson-demo' }),
      });
      expect(login.status).toBe(200);
    } finally {
      await server.stop();
    }
    await expect(fetch(`${server.url}/api/health`)).rejects.toThrow();

    // A second start on the same data reuses it: no second seed, same secret.
    const again = await startServer({
      env: {},
      mode: 'demo',
      port: 0,
      databasePath: join(folder, 'keelson.db'),
      logLevel: 'silent',
      afterSeed: () => {
        hookCalls += 1;
      },
    });
    await again.stop();
    expect(hookCalls).toBe(1);
  });

  it('invites the first administrator of an empty workspace outside demo mode', async () => {
    const server = await startServer({
      env: { KEELSON_ADMIN_EMAIL: 'Owner@Example.test' },
      mode: 'test',
      port: 0,
      databasePath: ':memory:',
      logLevel: 'silent',
    });
    try {
      const people = server.db
        .select({ email: users.email, role: users.role, hash: users.passwordHash })
        .from(users)
        .all();
      expect(people).toEqual([{ email: 'owner@example.test', role: 'admin', hash: null }]);
      const mail = server.db.select().from(mailMessages).all();
      expect(mail.map((message) => message.toAddresses)).toEqual([['owner@example.test']]);
      expect(mail[0]!.text).toContain(`http://127.0.0.1:${server.port}/set-password?token=`);
    } finally {
      await server.stop();
    }
  });

  it('refuses to start in production without its secrets', async () => {
    await expect(
      startServer({
        env: { KEELSON_MODE: 'production' },
        port: 0,
        databasePath: join(dataFolder(), 'k.db'),
        logLevel: 'silent',
      }),
    ).rejects.toThrow(ConfigError);
  });
});
