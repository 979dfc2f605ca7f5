import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { ConfigError, DEMO_PASSWORD, loadConfig } from './app-config';

const folders: string[] = [];
function dataFolder(): string {
  const folder = mkdtempSync(join(tmpdir(), 'keelson-config-'));
  folders.push(folder);
  return folder;
}
afterEach(() => {
  folders.splice(0).forEach((folder) => rmSync(folder, { recursive: true, force: true }));
});

describe('loadConfig', () => {
  it('defaults to demo mode on 127.0.0.1:3000 with data/keelson.db and 20 MB uploads', () => {
    const folder = dataFolder();
    const config = loadConfig({ DATABASE_PATH: join(folder, 'keelson.db') });
    expect(config).toMatchObject({
      mode: 'demo',
      host: '127.0.0.1',
      port: 3000,
      publicUrl: 'http://127.0.0.1:3000',
      isPublicUrlDerived: true,
      smtpUrl: null,
      uploadMaxBytes: 20 * 1024 * 1024,
      bcryptCost: 12,
      isSecureCookie: false,
      demoPassword: DEMO_PASSWORD,
      dataDir: folder,
    });
    expect(loadConfig({ DATABASE_PATH: join(folder, 'keelson.db') }).databasePath).toBe(
      join(folder, 'keelson.db'),
    );
  });

  it('generates the demo JWT secret once, with mode 0600, and reuses it', () => {
    const folder = dataFolder();
    const env = { DATABASE_PATH: join(folder, 'keelson.db') };
    const first = loadConfig(env);
    const file = join(folder, 'secret.jwt');
    expect(first.jwtSecretSource).toBe('file');
    // 48 random bytes in base64url are 64 characters.
    expect(first.jwtSecret).toHaveLength(64);
    expect(readFileSync(file, 'utf8').trim()).toBe(first.jwtSecret);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(loadConfig(env).jwtSecret).toBe(first.jwtSecret);
  });

  it('keeps a JWT_SECRET from the environment and writes no file', () => {
    const folder = dataFolder();
    const secret = 'k'.repeat(40);
    const config = loadConfig({ DATABASE_PATH: join(folder, 'k.db'), JWT_SECRET: secret });
    expect(config.jwtSecret).toBe(secret);
    expect(() => statSync(join(folder, 'secret.jwt'))).toThrow();
  });

  it('refuses to start in production without JWT_SECRET and SMTP_URL, naming both', () => {
    const attempt = () =>
      loadConfig({ KEELSON_MODE: 'production', DATABASE_PATH: join(dataFolder(), 'k.db') });
    expect(attempt).toThrow(ConfigError);
    expect(attempt).toThrow(/JWT_SECRET.*SMTP_URL/);
  });

  it('starts in production with both, without a demo password, on a derived https cookie', () => {
    const config = loadConfig({
      KEELSON_MODE: 'production',
      DATABASE_PATH: join(dataFolder(), 'k.db'),
      JWT_SECRET: 'p'.repeat(48),
      SMTP_URL: 'smtp://mailer:pw@mail.example.com:587',
      PUBLIC_URL: 'https://keelson.example.com/',
    });
    expect(config.demoPassword).toBeNull();
    expect(config.smtpUrl).toBe('smtp://mailer:pw@mail.example.com:587');
    expect(config.publicUrl).toBe('https://keelson.example.com');
    expect(config.isSecureCookie).toBe(true);
    expect(config.bcryptCost).toBe(12);
  });

  it('names every wrong variable', () => {
    const attempt = () =>
      loadConfig({
        PORT: 'eighty',
        KEELSON_MODE: 'staging',
        JWT_SECRET: 'short',
        PUBLIC_URL: 'ftp://x',
      });
    expect(attempt).toThrow(ConfigError);
    try {
      attempt();
    } catch (error) {
      const message = (error as Error).message;
      for (const name of ['PORT', 'KEELSON_MODE', 'JWT_SECRET', 'PUBLIC_URL']) {
        expect(message).toContain(name);
      }
    }
  });

  it('uses a per-process secret, cost 4 and silent logs in test mode', () => {
    const config = loadConfig({ KEELSON_MODE: 'test', DATABASE_PATH: ':memory:' });
    expect(config).toMatchObject({
      bcryptCost: 4,
      logLevel: 'silent',
      demoPassword: null,
      jwtSecretSource: 'generated-for-test',
    });
  });

  it('reads TRUST_PROXY as a hop count or a list, and refuses other text', () => {
    const base = { KEELSON_MODE: 'test', DATABASE_PATH: ':memory:' };
    expect(loadConfig(base).trustProxy).toBeNull();
    expect(loadConfig({ ...base, TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(loadConfig({ ...base, TRUST_PROXY: 'loopback, 10.0.0.0/8' }).trustProxy).toBe(
      'loopback, 10.0.0.0/8',
    );
    expect(() => loadConfig({ ...base, TRUST_PROXY: 'yes;rm' })).toThrow(/TRUST_PROXY/);
  });

  it('lets overrides win over the environment', () => {
    const config = loadConfig(
      { PORT: '8080', KEELSON_MODE: 'production' },
      { mode: 'test', port: 0, databasePath: ':memory:' },
    );
    expect(config.mode).toBe('test');
    expect(config.port).toBe(0);
  });

  it('tightens a demo secret file whose permissions were loosened', () => {
    const folder = dataFolder();
    const file = join(folder, 'secret.jwt');
    writeFileSync(file, `${'s'.repeat(64)}\n`, { mode: 0o644 });
    const config = loadConfig({ DATABASE_PATH: join(folder, 'k.db') });
    expect(config.jwtSecret).toBe('s'.repeat(64));
    expect(statSync(file).mode & 0o777).toBe(0o600);
  });

  it('schedules the digest on Mondays 07:00 UTC by default, off in test mode', () => {
    const demo = loadConfig({ DATABASE_PATH: join(dataFolder(), 'k.db') });
    expect([demo.digestSchedule, demo.digestTimeZone]).toEqual(['0 7 * * 1', 'UTC']);
    const test = loadConfig({ KEELSON_MODE: 'test', DATABASE_PATH: ':memory:' });
    expect([test.digestSchedule, test.digestTimeZone]).toEqual([null, 'UTC']);
  });

  it('reads KEELSON_DIGEST_CRON and KEELSON_DIGEST_TZ, and "off" switches the digest off', () => {
    const base = { KEELSON_MODE: 'test', DATABASE_PATH: ':memory:' };
    const config = loadConfig({ ...base, KEELSON_DIGEST_CRON: '30 6 * * 1-5',
      KEELSON_DIGEST_TZ: 'Europe/Berlin' });
    expect([config.digestSchedule, config.digestTimeZone]).toEqual(['30 6 * * 1-5',
      'Europe/Berlin']);
    const demo = { DATABASE_PATH: join(dataFolder(), 'k.db') };
    expect(loadConfig({ ...demo, KEELSON_DIGEST_CRON: 'OFF' }).digestSchedule).toBeNull();
    expect(loadConfig(base, { digestSchedule: '0 8 * * 1' }).digestSchedule).toBe('0 8 * * 1');
  });

  it('refuses a bad digest cron expression or time zone, naming the variable', () => {
    const base = { KEELSON_MODE: 'test', DATABASE_PATH: ':memory:' };
    expect(() => loadConfig({ ...base, KEELSON_DIGEST_CRON: '61 7 * * 1' }))
      .toThrow(/KEELSON_DIGEST_CRON: must be a cron expression.*minute/);
    expect(() => loadConfig({ ...base, KEELSON_DIGEST_CRON: 'every monday' }))
      .toThrow(/KEELSON_DIGEST_CRON/);
    expect(() => loadConfig({ ...base, KEELSON_DIGEST_TZ: 'Mars/Olympus' }))
      .toThrow(/KEELSON_DIGEST_TZ: must be an IANA time zone/);
  });
});
