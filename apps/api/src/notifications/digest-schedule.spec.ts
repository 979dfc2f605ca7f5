import cron from 'node-cron';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { NODE_CRON_SCHEDULER, startDigestSchedule } from './digest-schedule';
import {
  caughtMail,
  clearMail,
  fakeScheduler,
  insertEntry,
  insertPlan,
  insertTask,
  mountNotifications,
  recordingLogger,
} from './notification-fixtures';

// The schedule is never waited for: a fake scheduler records what was registered and the
// spec fires the job by hand, with the test app's clock as "now".
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  const db = t.database.db;
  const entry = insertEntry(db, { title: 'Kestrel Forgings', plants: ['P-NORTH'] });
  const plan = insertPlan(db, { entryId: entry, authorId: t.userId('risk@demo.test'),
    status: 'approved' });
  // The test clock stands at 2026-03-02, so this task is overdue.
  insertTask(db, { planId: plan, title: 'Audit the forge', ownerId: t.userId('buyer@demo.test'),
    dueDate: '2026-02-23' });
});
afterAll(() => t.close());

describe('the digest schedule', () => {
  it('registers the configured expression and time zone, sends when fired, stops on close',
    async () => {
      const scheduler = fakeScheduler();
      const mounted = mountNotifications(t, { scheduler,
        config: { digestSchedule: '30 6 * * 1', digestTimeZone: 'Europe/Berlin' } });
      expect(scheduler.jobs.map(({ expression, timezone, name, stopped }) =>
        ({ expression, timezone, name, stopped }))).toEqual([
        { expression: '30 6 * * 1', timezone: 'Europe/Berlin', name: 'overdue-digest',
          stopped: false },
      ]);
      clearMail(t.database.db);
      await scheduler.jobs[0]!.run();
      expect(caughtMail(t.database.db).map((message) => message.toAddresses[0]).sort())
        .toEqual(['buyer@demo.test', 'risk@demo.test']);
      expect(caughtMail(t.database.db)[0]!.text).toContain('due before 2026-03-02');
      expect(mounted.closers).toHaveLength(1);
      await mounted.close();
      expect(scheduler.jobs[0]!.stopped).toBe(true);
    });

  it('starts nothing when the config switches the digest off', async () => {
    const scheduler = fakeScheduler();
    const mounted = mountNotifications(t, { scheduler, config: { digestSchedule: null } });
    expect(scheduler.jobs).toEqual([]);
    await mounted.close();
  });

  it('logs a failing digest and keeps the schedule', async () => {
    const scheduler = fakeScheduler();
    const logger = recordingLogger();
    const job = startDigestSchedule({ config: { digestSchedule: '0 7 * * 1',
      digestTimeZone: 'UTC' }, scheduler, logger, now: () => t.clock.now,
      send: () => Promise.reject(new Error('database locked')) });
    await expect(scheduler.jobs[0]!.run()).resolves.toBeUndefined();
    expect(logger.errors.map((args) => args[1]))
      .toEqual(['the scheduled digest of overdue tasks failed']);
    expect(scheduler.jobs[0]!.stopped).toBe(false);
    await job?.stop();
  });

  it('hands node-cron the job and removes it again on stop', async () => {
    const before = cron.getTasks().size;
    const job = NODE_CRON_SCHEDULER.schedule('0 7 * * 1', async () => undefined,
      { timezone: 'UTC', name: 'spec-digest' });
    const task = [...cron.getTasks().values()].find((candidate) =>
      candidate.name === 'spec-digest');
    expect(task?.getPattern()).toBe('0 7 * * 1');
    expect(task?.getNextRun()?.getUTCDay()).toBe(1);
    await job.stop();
    expect(cron.getTasks().size).toBe(before);
  });
});
