/**
 * The re-scoring's timetable: the default (06:00 UTC, first Monday of each quarter), reading and
 * changing it through the API with its checks, the next firing counted from the test clock, the
 * quarter label from the schedule's zone, and the job fired by hand through a fake scheduler
 * (never by waiting): it starts a re-scoring as the system, and a quarter that has one is done.
 * Reference dates from the calendar: 1 April 2026 is a Wednesday (first Monday 6 April);
 * New Zealand's daylight time ends on 5 April 2026 (UTC+12 after).
 */
import cron from 'node-cron';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RescoringScheduleDto } from '@keelson/contracts';
import type { SessionUser } from '../http/auth-context';
import { fakeScheduler, recordingLogger } from '../notifications/notification-fixtures';
import { getAs } from '../runs/run-spec-helpers';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { nextRunOf, RESCORING_SCHEDULE_DEFAULT } from './rescoring-schedule';
import { RESCORING_JOB_NAME } from './rescoring-schedule.service';
import { mountSecondRescoring } from './rescoring-spec-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
}, 60_000);
afterAll(() => t.close());

const putSchedule = (body: object, role: 'admin' | 'risk_manager' = 'admin') =>
  request(t.app).put('/api/rescoring/schedule')
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`).send(body);

describe('GET and PUT /api/rescoring/schedule', () => {
  it('answers the default with its next firing from the clock (2026-03-02)', async () => {
    const response = await getAs(t, '/api/rescoring/schedule', 'viewer');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ cron: '0 6 * 1,4,7,10 1#1', timeZone: 'UTC',
      isEnabled: true, nextRunAt: '2026-04-06T06:00:00.000Z', updatedAt: null });
  });

  it('lets only an admin change it, and names the wrong field', async () => {
    const valid = { cron: '0 6 * 1,4,7,10 1#1', timeZone: 'Pacific/Auckland', isEnabled: true };
    expect((await putSchedule(valid, 'risk_manager')).status).toBe(403);
    const badCron = await putSchedule({ ...valid, cron: '0 6 * 13 1#1' });
    expect(badCron.status).toBe(400);
    expect(badCron.body.error.details.issues[0].path).toBe('body.cron');
    const badZone = await putSchedule({ ...valid, timeZone: 'Mars/Olympus' });
    expect(badZone.status).toBe(400);
    expect(badZone.body.error.details.issues[0]).toEqual({ path: 'body.timeZone',
      message: '"Mars/Olympus" is not an IANA time zone (for example UTC or Europe/Berlin)' });
    const missing = await putSchedule({ cron: valid.cron });
    expect(missing.body.error.details.issues[0].path).toBe('body.timeZone');
    const changed = await putSchedule(valid);
    expect(changed.status).toBe(200);
    expect(changed.body).toEqual({ ...valid, nextRunAt: '2026-04-05T18:00:00.000Z',
      updatedAt: t.clock.now.toISOString() } satisfies RescoringScheduleDto);
    const audit = t.database.sqlite.prepare("select before, after from audit_events where " +
      "action = 'rescoring.schedule_changed'").get() as { before: string; after: string };
    expect(JSON.parse(audit.before)).toEqual(RESCORING_SCHEDULE_DEFAULT);
    expect(JSON.parse(audit.after)).toEqual(valid);
    const off = await putSchedule({ ...valid, isEnabled: false });
    expect(off.body.nextRunAt).toBeNull();
    await putSchedule(RESCORING_SCHEDULE_DEFAULT);
  });
});

describe('the next firing', () => {
  it('agrees with node-cron on the next run counted from now', () => {
    const task = cron.createTask('0 6 * 1,4,7,10 1#1', () => undefined,
      { timezone: 'Europe/Berlin' });
    const [expected] = task.getNextRuns(1);
    void task.destroy();
    expect(nextRunOf('0 6 * 1,4,7,10 1#1', 'Europe/Berlin', new Date())).toEqual(expected);
  });
});

describe('the scheduled trigger', () => {
  it('registers the stored timetable, starts a re-scoring as the system, then stands down',
    async () => {
      await putSchedule({ cron: '0 6 * 1,4,7,10 1#1', timeZone: 'Pacific/Auckland',
        isEnabled: true });
      const scheduler = fakeScheduler();
      const logger = recordingLogger();
      const info: unknown[][] = [];
      logger.info = ((...args: unknown[]) => void info.push(args)) as typeof logger.info;
      const second = mountSecondRescoring(t, { scheduler, logger });
      expect(scheduler.jobs.map(({ expression, timezone, name, stopped }) =>
        ({ expression, timezone, name, stopped }))).toEqual([{ expression: '0 6 * 1,4,7,10 1#1',
        timezone: 'Pacific/Auckland', name: RESCORING_JOB_NAME, stopped: false }]);
      // 1 January 2027, 01:00 in Auckland; still 2026 in UTC.
      t.clock.now = new Date('2026-12-31T12:00:00.000Z');
      await scheduler.jobs[0]!.run();
      const [started] = second.rescoring.list({ limit: 10, offset: 0 }).items;
      expect(started).toMatchObject({ quarterLabel: '2027-Q1', trigger: 'schedule',
        startedBy: null, networkVersionId: 1 });
      await second.runs.settled(started!.analysisRunId!);
      expect(second.rescoring.get(started!.id).status).toBe('succeeded');
      await scheduler.jobs[0]!.run();
      expect(second.rescoring.list({ limit: 10, offset: 0 }).total).toBe(1);
      expect(info.map((args) => args[1])).toContain('the quarter was re-scored already; the ' +
        'scheduled re-scoring has nothing to do');
      expect(logger.errors).toEqual([]);
      // A change reschedules at once: the old job stops, the new one is registered.
      const adminUser: SessionUser = { id: t.userId('admin@demo.test'),
        email: 'admin@demo.test', name: 'Admin', role: 'admin', plantCodes: [] };
      second.schedule.update(adminUser, { cron: '0 7 * * 1', timeZone: 'UTC', isEnabled: true });
      expect(scheduler.jobs.map(({ expression, stopped }) => [expression, stopped])).toEqual([
        ['0 6 * 1,4,7,10 1#1', true], ['0 7 * * 1', false]]);
      await second.close();
      expect(scheduler.jobs[1]!.stopped).toBe(true);
    }, 60_000);

  it('starts no job in test mode without a scheduler of the spec', () => {
    const before = cron.getTasks().size;
    const second = mountSecondRescoring(t);
    expect(cron.getTasks().size).toBe(before);
    void second.close();
  });
});
