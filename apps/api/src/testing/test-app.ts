/**
 * A Keelson app for tests: a fresh in-memory database, the real SMTP sink on a free loopback
 * port, the demo workspace seeded with cheap bcrypt hashes, and helpers to sign in. One per test
 * file (or per test where state matters); always `close()` it.
 */
import type { Express } from 'express';
import request from 'supertest';
import { CSRF_HEADER, CSRF_HEADER_VALUE, SESSION_COOKIE, type Role } from '@keelson/contracts';
import { IN_MEMORY, openDatabase, type OpenDatabase } from '@keelson/db';
import { createKeelsonApp, type KeelsonApp } from '../app';
import type { LoginRateLimits } from '../auth/login-rate-limits';
import { createPasswordHasher } from '../auth/password-hasher';
import { SessionTokens } from '../auth/session-token';
import { DEMO_PASSWORD, loadConfig, type AppConfig } from '../config/app-config';
import { createLogger } from '../http/request-logging';
import { startMailSink, type MailSink } from '../mail/mail-sink';
import { MailRepository } from '../mail/mail.repository';
import { createSmtpMailer, type Mailer } from '../mail/mailer';
import { importDemoNetwork } from '../seed/demo-network';
import { DEMO_ACCOUNTS, seedDemoWorkspace } from '../seed/demo-workspace';

/** The demo account e-mail of each role (plant manager: P-NORTH's). */
export const ACCOUNT_OF_ROLE: Record<Role, string> = {
  admin: 'admin@demo.test',
  buyer: 'buyer@demo.test',
  risk_manager: 'risk@demo.test',
  plant_manager: 'plant.north@demo.test',
  viewer: 'viewer@demo.test',
};

/** A test app and its parts. */
export interface TestApp extends KeelsonApp {
  app: Express;
  database: OpenDatabase;
  config: AppConfig;
  mailer: Mailer;
  mailSink: MailSink;
  mail: MailRepository;
  /** The test clock; move `clock.now` to travel in time. */
  clock: { now: Date };
  /** A Bearer token for a demo account (signed like a real login). */
  tokenFor(email: string): string;
  /** Signs in through the API and returns the `Cookie` header value. */
  signIn(email: string, password?: string): Promise<string>;
  /** Headers of a cookie session with the CSRF header. */
  cookieHeaders(cookie: string): Record<string, string>;
  /** The user id of an e-mail address. */
  userId(email: string): number;
  close(): Promise<void>;
}

/** Options of {@link createTestApp}. */
export interface TestAppOptions {
  rateLimits?: Partial<LoginRateLimits>;
  publicUrl?: string;
  webRoot?: string;
  /** Import the demo network (`data/demo/keelson-demo.xlsx`) as the demo buyer after seeding. */
  withDemoNetwork?: boolean;
  /** The upload limit in bytes (`UPLOAD_MAX_BYTES`); 20 MB unless given. */
  uploadMaxBytes?: number;
}

/** Builds a {@link TestApp}. */
export async function createTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  const config = loadConfig(
    {},
    {
      mode: 'test',
      databasePath: IN_MEMORY,
      port: 0,
      publicUrl: options.publicUrl ?? 'http://keelson.test:4200',
      webRoot: options.webRoot ?? '/nonexistent/keelson-web-build',
      smtpUrl: null,
      ...(options.uploadMaxBytes === undefined ? {} : { uploadMaxBytes: options.uploadMaxBytes }),
    },
  );
  const database = openDatabase(IN_MEMORY);
  const logger = createLogger('silent');
  const mail = new MailRepository(database.db);
  const mailSink = await startMailSink({ mail, logger });
  const mailer = createSmtpMailer({ host: mailSink.host, port: mailSink.port }, config.mailFrom);
  const clock = { now: new Date('2026-03-02T09:00:00.000Z') };
  await seedDemoWorkspace(database.db, {
    hashPassword: createPasswordHasher(config.bcryptCost).hash,
    now: () => clock.now,
    afterSeed: options.withDemoNetwork
      ? async (db) => {
        await importDemoNetwork(db, { now: () => clock.now,
          limits: { maxBytes: config.uploadMaxBytes } });
      }
      : undefined,
  });
  const built = createKeelsonApp({
    config,
    db: database.db,
    mailer,
    logger,
    rateLimits: options.rateLimits ?? { perAddress: 10_000, failuresPerAccount: 10_000 },
    now: () => clock.now,
  });
  const tokens = new SessionTokens(config.jwtSecret);
  const userId = (email: string): number => {
    const row = database.sqlite
      .prepare('select id from users where email = ?')
      .get(email.toLowerCase()) as { id: number } | undefined;
    if (!row) throw new Error(`No user ${email} in the test database.`);
    return row.id;
  };
  return {
    ...built,
    database,
    config,
    mailer,
    mailSink,
    mail,
    clock,
    userId,
    tokenFor(email) {
      const account = DEMO_ACCOUNTS.find((candidate) => candidate.email === email);
      const role = (
        database.sqlite.prepare('select role from users where email = ?').get(email) as
          | { role: Role }
          | undefined
      )?.role;
      return tokens.sign(userId(email), role ?? account?.role ?? 'viewer');
    },
    async signIn(email, password = DEMO_PASSWORD) {
      const response = await request(built.app)
        .post('/api/auth/login')
        .set(CSRF_HEADER, CSRF_HEADER_VALUE)
        .send({ email, password });
      if (response.status !== 200) {
        throw new Error(`Sign-in of ${email} answered ${response.status}: ${response.text}`);
      }
      const cookie = ([] as string[])
        .concat(response.headers['set-cookie'] ?? [])
        .find((line) => line.startsWith(`${SESSION_COOKIE}=`));
      if (!cookie) throw new Error('The sign-in set no session cookie.');
      return cookie.split(';')[0]!;
    },
    cookieHeaders(cookie) {
      return { Cookie: cookie, [CSRF_HEADER]: CSRF_HEADER_VALUE };
    },
    async close() {
      // The features' clean-ups first (e-mail still being sent, schedules), then the rest.
      await built.close();
      mailer.close();
      await mailSink.stop();
      database.close();
    },
  };
}
