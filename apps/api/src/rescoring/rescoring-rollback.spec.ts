/**
 * A re-scoring is all or nothing: its scores, flags and the register sync are written in the
 * analysis run's one transaction, so a hook that throws in there rolls every row back, the run
 * fails and the re-scoring fails with the error (then resumes cleanly). Also the run service's
 * hooks on their own: order around the register sync, and one settled call per run.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AnalysisRunDto } from '@keelson/contracts';
import { createTestApp, type TestApp } from '../testing/test-app';
import type { SessionUser } from '../http/auth-context';
import {
  countOf,
  entryRows,
  mountSecondRescoring,
  scoreRows,
  type SecondRescoring,
} from './rescoring-spec-helpers';

let t: TestApp;
let second: SecondRescoring;
const admin = (): SessionUser => ({ id: t.userId('admin@demo.test'), email: 'admin@demo.test',
  name: 'Admin', role: 'admin', plantCodes: [] });

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  second = mountSecondRescoring(t);
  // A register to re-score: a manual run's entries, one of them stale and one deleted (the
  // sync would bring both back).
  const run = second.runs.start(null, { networkVersionId: 1, label: 'Before the quarter' });
  expect((await second.runs.settled(run.id)).status).toBe('succeeded');
  const sqlite = t.database.sqlite;
  sqlite.prepare("update register_entries set rating = 1, rating_band = 'low' where " +
    "supplier_code = 'S-2-SHARED-A'").run();
  sqlite.prepare("delete from register_entries where supplier_code = 'S-2-SHARED-B'").run();
}, 60_000);
afterAll(async () => {
  await second.close();
  await t.close();
});

describe('a hook that throws inside the run transaction', () => {
  it('rolls back the results, the register sync and the scores; the re-scoring fails',
    async () => {
      const before = entryRows(t);
      const auditBefore = countOf(t, 'audit_events');
      const outboxBefore = countOf(t, 'mail_outbox');
      const stages: string[] = [];
      const unhookBefore = second.runs.onSucceededInTransaction((tx, run) => {
        stages.push(`before:${countOf(t, 'register_entries')}:${run.status}`);
        expect(tx).toBeDefined();
      }, 'before_register_sync');
      const unhook = second.runs.onSucceededInTransaction(() => {
        stages.push('after');
        throw new Error('disk full while scoring');
      });
      const started = second.rescoring.start(admin(), { force: false,
        quarterLabel: '2027-Q1' }, 'manual');
      const run = await second.runs.settled(started.analysisRunId!);
      unhookBefore();
      unhook();
      // The sync ran (entries were created) before the throwing hook, and was rolled back.
      expect(stages).toEqual([`before:${before.length}:succeeded`, 'after']);
      expect(run.status).toBe('failed');
      expect(run.error).toBe('The analysis failed: disk full while scoring');
      const failed = second.rescoring.get(started.id);
      expect(failed.status).toBe('failed');
      expect(failed.error).toBe(`The analysis failed: disk full while scoring (analysis run ` +
        `${run.id})`);
      expect(entryRows(t)).toEqual(before);
      expect(before.find((row) => row.supplier_code === 'S-2-SHARED-A')!.rating).toBe(1);
      expect(scoreRows(t, started.id)).toEqual([]);
      expect(countOf(t, 'run_suppliers where run_id = ?', run.id)).toBe(0);
      // The e-mails were written in the same transaction (before the throwing hook), so none is
      // left to tell of a re-scoring that did not happen.
      expect(countOf(t, 'mail_outbox')).toBe(outboxBefore);
      // Only the start and the failure are recorded: no run.succeeded, no flag changes.
      expect(t.database.sqlite.prepare('select action from audit_events where id > ? ' +
        'order by id').all(auditBefore)).toEqual([{ action: 'rescoring.started' },
        { action: 'rescoring.failed' }]);
    }, 60_000);

  it('resumes the failed re-scoring once the fault is gone', async () => {
    const failed = second.rescoring.list({ limit: 1, offset: 0 }).items[0]!;
    const resumed = second.rescoring.resume(admin(), failed.id, { mode: 'resume' });
    expect(resumed).toMatchObject({ status: 'queued', attempts: 2 });
    await second.runs.settled(resumed.analysisRunId!);
    const done = second.rescoring.get(failed.id);
    expect(done.status).toBe('succeeded');
    expect(done.summary!.created).toBe(1);
    expect(entryRows(t).find((row) => row.supplier_code === 'S-2-SHARED-A')!.rating)
      .toBeGreaterThan(1);
    expect(scoreRows(t, failed.id).length).toBe(entryRows(t).length);
    await second.rescoring.settled();
    const mailsSent = second.rescoring.get(failed.id).summary!.mailsSent;
    expect(mailsSent).toBeGreaterThan(0);
    expect(countOf(t, "mail_outbox where kind = 'rescoring' and status = 'sent'")).toBe(mailsSent);
  }, 60_000);
});

describe('settled hooks', () => {
  it('are called once per run, also for a run cancelled while it waits', async () => {
    const seen: AnalysisRunDto[] = [];
    second.runs.onSettled((run) => void seen.push(run));
    const first = second.runs.start(null, { networkVersionId: 1, label: 'Runs' });
    const waiting = second.runs.start(null, { networkVersionId: 1, label: 'Waits' });
    second.runs.cancel(waiting.id);
    await second.runs.settled(first.id);
    expect(seen.map((run) => [run.id, run.status])).toEqual([[waiting.id, 'cancelled'],
      [first.id, 'succeeded']]);
    expect(first.kind).toBe('manual');
  }, 60_000);
});
