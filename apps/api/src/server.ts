import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import type { Logger } from 'pino';
import { openDatabase, type KeelsonDatabase } from '@keelson/db';
import { createKeelsonApp, type KeelsonApp } from './app';
import type { LoginRateLimits } from './auth/login-rate-limits';
import { createPasswordHasher } from './auth/password-hasher';
import { loadConfig, type AppConfig, type ConfigOverrides } from './config/app-config';
import { createLogger } from './http/request-logging';
import { startMailSink, type MailSink } from './mail/mail-sink';
import { MailRepository } from './mail/mail.repository';
import { createSmtpMailer } from './mail/mailer';
import { importDemoNetwork } from './seed/demo-network';
import { seedDemoWorkspace } from './seed/demo-workspace';
import { inviteFirstAdmin } from './seed/first-admin';

/** Options of {@link startServer}: config overrides plus start-up hooks. */
export interface StartServerOptions extends ConfigOverrides {
  /** The environment to read; `process.env` by default. */
  env?: Record<string, string | undefined>;
  /**
   * Runs after a demo seed of an empty database; by default it imports the demo network
   * (`importDemoNetwork`). Tests pass their own to skip or observe it.
   */
  afterSeed?: (db: KeelsonDatabase) => Promise<void> | void;
  rateLimits?: Partial<LoginRateLimits>;
}

/** A running server. */
export interface RunningServer {
  /** The real port (useful after asking for port 0). */
  port: number;
  url: string;
  config: AppConfig;
  app: Express;
  db: KeelsonDatabase;
  logger: Logger;
  /** The local SMTP sink, when no SMTP_URL is configured. */
  mailSink: MailSink | null;
  /** Stops accepting requests, closes connections, the sink and the database. */
  stop(): Promise<void>;
}

/**
 * Starts Keelson: loads the config (throwing `ConfigError` when it cannot start), opens and
 * migrates the database, starts the local SMTP sink when no SMTP_URL is set, seeds an empty
 * database in demo mode, and listens on HOST:PORT.
 */
export async function startServer(options: StartServerOptions = {}): Promise<RunningServer> {
  const { env, afterSeed, rateLimits, ...overrides } = options;
  const config = loadConfig(env ?? process.env, overrides);
  const logger = createLogger(config.logLevel);
  const database = openDatabase(config.databasePath);
  let mailSink: MailSink | null = null;
  let server: Server | undefined;
  let keelson: KeelsonApp | undefined;
  try {
    mailSink = config.smtpUrl
      ? null
      : await startMailSink({ mail: new MailRepository(database.db), logger });
    const mailer = createSmtpMailer(
      config.smtpUrl ? { url: config.smtpUrl } : { host: mailSink!.host, port: mailSink!.port },
      config.mailFrom,
    );
    if (config.mode === 'demo') {
      const seeded = await seedDemoWorkspace(database.db, {
        hashPassword: createPasswordHasher(config.bcryptCost).hash,
        afterSeed: afterSeed ?? (async (db) => {
          const imported = await importDemoNetwork(db, {
            limits: { maxBytes: config.uploadMaxBytes },
          });
          logger.info({ networkVersionId: imported.networkVersionId, counts: imported.counts },
            'imported the demo network');
        }),
      });
      if (seeded.isSeeded) {
        logger.info(seeded, 'seeded the demo workspace (password keelson-demo)');
      }
    }
    keelson = createKeelsonApp({
      config,
      db: database.db,
      mailer,
      logger,
      rateLimits,
    });
    const { app, services } = keelson;
    const started = keelson;
    server = await listen(app, config.host, config.port);
    const port = (server.address() as AddressInfo).port;
    if (config.isPublicUrlDerived) {
      config.publicUrl = config.publicUrl.replace(/:\d+$/, `:${port}`);
    }
    const url = `http://${config.host.includes(':') ? `[${config.host}]` : config.host}:${port}`;
    if (config.mode !== 'demo' && config.firstAdminEmail) {
      const invited = await inviteFirstAdmin(services.users, database.db, config.firstAdminEmail);
      if (invited) {
        logger.info({ email: config.firstAdminEmail }, 'invited the first administrator');
      }
    }
    logger.info(
      { url, publicUrl: config.publicUrl, mode: config.mode, mailSink: mailSink?.port ?? null },
      `Keelson is listening on ${url}`,
    );
    const running = server;
    let stopping: Promise<void> | undefined;
    return {
      port,
      url,
      config,
      app,
      db: database.db,
      logger,
      mailSink,
      stop() {
        stopping ??= (async () => {
          await new Promise<void>((resolve) => {
            running.close(() => resolve());
            running.closeAllConnections();
          });
          await started.close();
          mailer.close();
          await mailSink?.stop();
          database.close();
        })();
        return stopping;
      },
    };
  } catch (error) {
    server?.close();
    await keelson?.close();
    await mailSink?.stop();
    database.close();
    throw error;
  }
}

function listen(app: Express, host: string, port: number): Promise<Server> {
  return new Promise((resolve, reject) => {
    const server = app.listen(port, host);
    server.once('listening', () => {
      server.off('error', reject);
      resolve(server);
    });
    server.once('error', reject);
  });
}
