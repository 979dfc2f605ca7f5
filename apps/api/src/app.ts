import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import type { Logger } from 'pino';
import type { KeelsonDatabase } from '@keelson/db';
import { createAuthRouter } from './auth/auth.router';
import { AuthService } from './auth/auth.service';
import { LOGIN_RATE_LIMIT_DEFAULTS, type LoginRateLimits } from './auth/login-rate-limits';
import { createPasswordHasher } from './auth/password-hasher';
import { SessionTokens } from './auth/session-token';
import type { AppConfig } from './config/app-config';
import { appVersion } from './config/app-version';
import { createHealthRouter } from './health/health.router';
import { HealthRepository } from './health/health.repository';
import { HealthService } from './health/health.service';
import { authenticate } from './http/authenticate';
import { apiNotFoundHandler, errorHandler } from './http/error-handler';
import { requestLogging } from './http/request-logging';
import { securityHeaders } from './http/security-headers';
import { serveWebClient } from './http/web-client';
import { createMailRouter } from './mail/mail.router';
import { MailRepository } from './mail/mail.repository';
import { MailService } from './mail/mail.service';
import { MailOutbox } from './mail/mail-outbox';
import type { Mailer } from './mail/mailer';
import { mountAuditRoutes } from './audit/audit.module';
import { mountComparisonRoutes } from './comparison/comparison.module';
import { mountDashboardRoutes } from './dashboard/dashboard.module';
import { mountImportRoutes } from './imports/imports.module';
import { NetworkGraphCache } from './network/network-graph-cache';
import { mountNetworkRoutes } from './network/network.module';
import { mountNetworkPictureRoutes } from './network-picture/network-picture.module';
import { mountNotificationRoutes } from './notifications/notifications.module';
import { mountPlanRoutes } from './plans/plans.module';
import { mountRegisterRoutes } from './register/register.module';
import { mountRescoringRoutes } from './rescoring/rescoring.module';
import { mountRunRoutes } from './runs/runs.module';
import { createPlantsRouter } from './plants/plants.router';
import { PlantsRepository } from './plants/plants.repository';
import { PlantsService } from './plants/plants.service';
import { InvitationRepository } from './users/invitation.repository';
import { createUsersRouter } from './users/users.router';
import { UsersRepository } from './users/users.repository';
import { UsersService } from './users/users.service';

/** Everything {@link createApp} is built from; tests pass an in-memory database and a sink. */
export interface AppDeps {
  config: AppConfig;
  db: KeelsonDatabase;
  mailer: Mailer;
  logger: Logger;
  /** Sign-in limits; defaults to {@link LOGIN_RATE_LIMIT_DEFAULTS}. */
  rateLimits?: Partial<LoginRateLimits>;
  /** The clock; tests move it to expire invitations. */
  now?: () => Date;
}

/** The app and the services later components and tests reach for. */
export interface KeelsonApp {
  app: Express;
  services: { auth: AuthService; users: UsersService; plants: PlantsService; mail: MailService };
  /** Stops what the features started (schedulers); the server calls it before closing. */
  close(): Promise<void>;
}

/**
 * Builds the Express app: security headers, request logging with ids, JSON and cookie parsing,
 * authentication, the `/api` component routers (each route declares its roles), JSON 404 for
 * unknown `/api` paths, the web client with its SPA fallback, and the central error handler.
 */
export function createKeelsonApp(deps: AppDeps): KeelsonApp {
  const { config, db } = deps;
  const now = deps.now ?? (() => new Date());
  const rateLimits = { ...LOGIN_RATE_LIMIT_DEFAULTS, ...deps.rateLimits };

  const usersRepository = new UsersRepository(db);
  const invitations = new InvitationRepository(db);
  const plantsRepository = new PlantsRepository(db);
  const mailRepository = new MailRepository(db);
  const auth = new AuthService({
    users: usersRepository,
    invitations,
    hasher: createPasswordHasher(config.bcryptCost),
    tokens: new SessionTokens(config.jwtSecret),
    now,
  });
  const users = new UsersService({
    users: usersRepository,
    invitations,
    plants: plantsRepository,
    mailer: deps.mailer,
    publicUrl: () => config.publicUrl,
    now,
  });
  const plants = new PlantsService(plantsRepository);
  const mail = new MailService(mailRepository);
  const health = new HealthService(new HealthRepository(db), appVersion(), config.mode);

  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'simple');
  if (config.trustProxy !== null) {
    app.set('trust proxy', config.trustProxy);
  }
  app.use(securityHeaders(config.isSecureCookie));
  app.use(requestLogging(deps.logger));
  app.use('/api', express.json({ limit: '1mb' }), cookieParser(), authenticate((token) =>
    auth.resolveSession(token),
  ));
  app.use('/api/health', createHealthRouter(health));
  app.use(
    '/api/auth',
    createAuthRouter(auth, { isSecureCookie: config.isSecureCookie, rateLimits }),
  );
  app.use('/api/users', createUsersRouter(users));
  app.use('/api/plants', createPlantsRouter(plants));
  const outbox = new MailOutbox({ db, mailer: deps.mailer, logger: deps.logger, now });
  app.use('/api/admin/mail', createMailRouter(mail, outbox));
  const closers: (() => void | Promise<void>)[] = [];
  const featureDeps = { config, db, logger: deps.logger, now, plants: plantsRepository,
    graphs: new NetworkGraphCache(db), mailer: deps.mailer, outbox,
    onClose: (close: () => void | Promise<void>) => void closers.push(close) };
  // Closed last (the closers run in reverse): the features' last messages are written first.
  featureDeps.onClose(() => outbox.close());
  // Sends what a stopped server left waiting, then retries on a timer; tests drive it by hand.
  if (config.mode !== 'test') outbox.start();
  mountImportRoutes(app, featureDeps);
  mountNetworkRoutes(app, featureDeps);
  const runs = mountRunRoutes(app, featureDeps);
  mountRegisterRoutes(app, featureDeps);
  mountNetworkPictureRoutes(app, featureDeps);
  const planEvents = mountNotificationRoutes(app, featureDeps);
  mountPlanRoutes(app, featureDeps, planEvents);
  mountAuditRoutes(app, featureDeps);
  mountRescoringRoutes(app, featureDeps, runs);
  mountComparisonRoutes(app, featureDeps);
  mountDashboardRoutes(app, featureDeps);
  app.use('/api', apiNotFoundHandler);
  serveWebClient(app, config.webRoot);
  app.use(errorHandler);
  return {
    app,
    services: { auth, users, plants, mail },
    async close() {
      for (const close of closers.splice(0).reverse()) await close();
    },
  };
}

/** The Express app alone (see {@link createKeelsonApp}). */
export function createApp(deps: AppDeps): Express {
  return createKeelsonApp(deps).app;
}
