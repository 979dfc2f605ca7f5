/**
 * Test fixtures for the notification specs: register entries, plans, tasks, users and mail
 * preferences written straight into the database with Drizzle (the specs do not depend on the
 * plans API), a fake digest scheduler, and the notifications module mounted on its own app with
 * the test app's database, mailer and clock.
 */
import express from 'express';
import { eq } from 'drizzle-orm';
import {
  mailMessages,
  mailPreferences,
  mitigationPlans,
  planTasks,
  registerEntries,
  registerEntryPlants,
  userPlants,
  users,
  type KeelsonDatabase,
  type MailMessageRow,
} from '@keelson/db';
import type { MailKind, PlanStatus, PlanStrategy, Role, TaskStatus } from '@keelson/contracts';
import type { AppConfig } from '../config/app-config';
import type { FeatureDeps } from '../feature-deps';
import { MailOutbox } from '../mail/mail-outbox';
import { NetworkGraphCache } from '../network/network-graph-cache';
import type { TestApp } from '../testing/test-app';
import type { DigestScheduler } from './digest-schedule';
import { mountNotificationRoutes } from './notifications.module';
import type { PlanNotifier } from './plan-notifier';

const STAMP = '2026-03-01T09:00:00.000Z';

/** Writes a register entry touching `plants`; returns its id. */
export function insertEntry(db: KeelsonDatabase, entry: {
  title: string;
  supplierCode?: string;
  ownerId?: number | null;
  plants: string[];
}): number {
  const id = db.insert(registerEntries).values({
    supplierCode: entry.supplierCode ?? 'S-2-SHARED-A',
    title: entry.title,
    origin: 'manual',
    status: 'open',
    ownerId: entry.ownerId ?? null,
    computedLikelihood: 3,
    impactBand: 4,
    rating: 12,
    ratingBand: 'high',
    createdAt: STAMP,
    updatedAt: STAMP,
  }).returning({ id: registerEntries.id }).get().id;
  for (const plantCode of entry.plants) {
    db.insert(registerEntryPlants).values({ entryId: id, plantCode }).run();
  }
  return id;
}

/** A what-if as the plans feature stores it (only the fields the e-mails read matter here). */
export const SAMPLE_WHAT_IF = {
  before: { rating: 12, ratingBand: 'high', singlePointOfFailure: true },
  after: { rating: 4, ratingBand: 'low', singlePointOfFailure: false },
};

/** Writes a plan of `entryId`; returns its id. */
export function insertPlan(db: KeelsonDatabase, plan: {
  entryId: number;
  authorId: number | null;
  description?: string;
  strategy?: PlanStrategy;
  status?: PlanStatus;
  whatIf?: Record<string, unknown> | null;
}): number {
  return db.insert(mitigationPlans).values({
    entryId: plan.entryId,
    strategy: plan.strategy ?? 'second_source',
    description: plan.description ?? 'Qualify a second forge for the flange.',
    estimatedCost: 25_000,
    targetDate: '2026-06-30',
    status: plan.status ?? 'submitted',
    changes: [],
    whatIf: plan.whatIf === undefined ? SAMPLE_WHAT_IF : plan.whatIf,
    authorId: plan.authorId,
    createdAt: STAMP,
    updatedAt: STAMP,
    submittedAt: STAMP,
  }).returning({ id: mitigationPlans.id }).get().id;
}

/** Writes a task of `planId`; returns its id. */
export function insertTask(db: KeelsonDatabase, task: {
  planId: number;
  title: string;
  ownerId: number | null;
  dueDate: string | null;
  status?: TaskStatus;
}): number {
  return db.insert(planTasks).values({
    planId: task.planId,
    title: task.title,
    ownerId: task.ownerId,
    dueDate: task.dueDate,
    status: task.status ?? 'todo',
    createdAt: STAMP,
    updatedAt: STAMP,
  }).returning({ id: planTasks.id }).get().id;
}

/** Writes a user (no password: they cannot sign in, but can get e-mail); returns the id. */
export function insertUser(db: KeelsonDatabase, user: {
  email: string;
  name: string;
  role: Role;
  isActive?: boolean;
  plants?: string[];
}): number {
  const id = db.insert(users).values({
    email: user.email,
    name: user.name,
    role: user.role,
    isActive: user.isActive ?? true,
    createdAt: STAMP,
    updatedAt: STAMP,
  }).returning({ id: users.id }).get().id;
  for (const plantCode of user.plants ?? []) {
    db.insert(userPlants).values({ userId: id, plantCode }).run();
  }
  return id;
}

/** Switches `kinds` off for `userId` (replacing an earlier choice). */
export function unsubscribe(db: KeelsonDatabase, userId: number, kinds: MailKind[]): void {
  db.delete(mailPreferences).where(eq(mailPreferences.userId, userId)).run();
  db.insert(mailPreferences).values({ userId, unsubscribed: kinds, updatedAt: STAMP }).run();
}

/** Deactivates or reactivates a user. */
export function setActive(db: KeelsonDatabase, userId: number, isActive: boolean): void {
  db.update(users).set({ isActive }).where(eq(users.id, userId)).run();
}

/** Forgets every caught message (a clean sink per test). */
export function clearMail(db: KeelsonDatabase): void {
  db.delete(mailMessages).run();
}

/** Every caught message, oldest first. */
export function caughtMail(db: KeelsonDatabase): MailMessageRow[] {
  return db.select().from(mailMessages).orderBy(mailMessages.id).all();
}

/** The messages caught for one address. */
export function mailTo(db: KeelsonDatabase, email: string): MailMessageRow[] {
  return caughtMail(db).filter((message) => message.toAddresses.includes(email));
}

/** A scheduler that only records what it was asked and can fire the job by hand. */
export interface FakeScheduler extends DigestScheduler {
  jobs: { expression: string; timezone: string; name: string; run: () => Promise<void>;
    stopped: boolean }[];
}

/** A {@link FakeScheduler}. */
export function fakeScheduler(): FakeScheduler {
  const jobs: FakeScheduler['jobs'] = [];
  return {
    jobs,
    schedule(expression, run, options) {
      const job = { expression, run, ...options, stopped: false };
      jobs.push(job);
      return { stop: () => void (job.stopped = true) };
    },
  };
}

/** The module mounted on its own app, with the closers it registered. */
export interface MountedNotifications {
  app: express.Express;
  notifier: PlanNotifier;
  closers: (() => void | Promise<void>)[];
  close(): Promise<void>;
}

/**
 * Mounts the notifications module on a fresh Express app over the test app's database,
 * mailer, logger and clock, with `config` changes (the digest's schedule) and a scheduler.
 */
export function mountNotifications(
  t: TestApp,
  options: { config?: Partial<AppConfig>; scheduler?: DigestScheduler;
    mailer?: FeatureDeps['mailer']; logger?: FeatureDeps['logger'] } = {},
): MountedNotifications {
  const app = express();
  const closers: (() => void | Promise<void>)[] = [];
  const logger = options.logger ?? silentLogger();
  const mailer = options.mailer ?? t.mailer;
  const deps: FeatureDeps = {
    config: { ...t.config, ...options.config },
    db: t.database.db,
    logger,
    now: () => t.clock.now,
    plants: { managersOf: () => [] } as unknown as FeatureDeps['plants'],
    graphs: new NetworkGraphCache(t.database.db),
    mailer,
    outbox: new MailOutbox({ db: t.database.db, mailer, logger, now: () => t.clock.now }),
    onClose: (close) => void closers.push(close),
  };
  const notifier = mountNotificationRoutes(app, deps, {
    scheduler: options.scheduler ?? fakeScheduler(),
  });
  return {
    app,
    notifier,
    closers,
    async close() {
      for (const close of closers.splice(0)) await close();
    },
  };
}

/** A logger that records errors and warnings and drops everything else. */
export function recordingLogger():
  FeatureDeps['logger'] & { errors: unknown[][]; warnings: unknown[][] } {
  const errors: unknown[][] = [];
  const warnings: unknown[][] = [];
  const ignore = () => undefined;
  return { errors, warnings, error: (...args: unknown[]) => void errors.push(args),
    warn: (...args: unknown[]) => void warnings.push(args), info: ignore, debug: ignore,
    trace: ignore, fatal: ignore } as unknown as
    FeatureDeps['logger'] & { errors: unknown[][]; warnings: unknown[][] };
}

function silentLogger(): FeatureDeps['logger'] {
  return recordingLogger();
}
