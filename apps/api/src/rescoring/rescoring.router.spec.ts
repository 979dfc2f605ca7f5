/**
 * The quarterly re-scoring through the API on the demo network (imported as version 1; its
 * tier-2 single points of failure S-2-SHARED-A and S-2-SHARED-B are built on purpose by
 * tools/demo-network.ts): who may start one, the scores and flags it writes, the e-mails read
 * back from the sink, the quarter's lock (also under concurrent starts), an admin's force, a
 * supplier removed in a second version, cancel, a restart's `interrupted` with resume and
 * restart. The test clock stands at 2026-03-02 (quarter 2026-Q1 in UTC).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RescoringRunDto, Role } from '@keelson/contracts';
import { generateTieredNetwork } from '@keelson/supply-graph/testing';
import { writeWorkbook } from '@keelson/workbook';
import { createKeelsonApp } from '../app';
import { createLogger } from '../http/request-logging';
import { upload } from '../imports/import-fixtures';
import { insertTestVersion } from '../network/network-test-versions';
import { insertUser, unsubscribe } from '../notifications/notification-fixtures';
import { demoModel, getAs, postAs, runToEnd, waitForRun } from '../runs/run-spec-helpers';
import { createTestApp, type TestApp } from '../testing/test-app';
import { INTERRUPTED_MESSAGE } from './rescoring.service';
import {
  countOf,
  entryRows,
  rescoreToEnd,
  scoreRows,
  waitForRescoring,
} from './rescoring-spec-helpers';

let t: TestApp;
const sql = () => t.database.sqlite;

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
}, 60_000);
afterAll(() => t.close());

/** Waits until the e-mails of a re-scoring have been counted into its summary. */
async function withMailsCounted(id: number): Promise<RescoringRunDto> {
  for (let i = 0; i < 200; i++) {
    const rescoring = (await getAs(t, `/api/rescoring/${id}`)).body as RescoringRunDto;
    if ((rescoring.summary?.mailsSent ?? 0) > 0) return rescoring;
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
  throw new Error(`Re-scoring ${id} counted no e-mails.`);
}

describe('who may start a re-scoring', () => {
  it.each<Role>(['buyer', 'viewer', 'plant_manager'])('refuses a %s with 403', async (role) => {
    const response = await postAs(t, '/api/rescoring', {}, role);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });
  it('refuses force to a risk manager, and names a missing version or a wrong field',
    async () => {
      const forced = await postAs(t, '/api/rescoring', { force: true });
      expect(forced.status).toBe(403);
      expect(forced.body.error.message).toMatch(/Only an administrator can force/);
      const missing = await postAs(t, '/api/rescoring', { networkVersionId: 77 });
      expect(missing.status).toBe(404);
      expect(missing.body.error.message).toMatch(/no network version 77/);
      const bad = await postAs(t, '/api/rescoring', { quarterLabel: '2026-Q5' });
      expect(bad.status).toBe(400);
      expect(bad.body.error.details.issues[0].path).toBe('body.quarterLabel');
      expect(countOf(t, 'rescoring_runs')).toBe(0);
    });
});

describe('a re-scoring of the demo network', () => {
  let first: RescoringRunDto;
  let lowEntry: number;
  let goneEntry: number;
  let sharedA: number;

  beforeAll(async () => {
    // A manual run first, so the register has entries to re-score.
    const run = await runToEnd(t, 1, 'Before the quarter');
    expect(run.status).toBe('succeeded');
    const quiet = sql().prepare('select code from run_suppliers where run_id = ? and ' +
      'single_point_of_failure = 0 and impact_band <= 4 order by code limit 1')
      .get(run.id) as { code: string };
    const insert = sql().prepare("insert into register_entries (supplier_code, title, origin, " +
      "status, computed_likelihood, likelihood_override, impact_band, rating, rating_band, " +
      "notes, created_at, updated_at) values (?, ?, 'manual', 'open', 3, ?, 3, 9, 'medium', " +
      "'', '2026-03-01T00:00:00.000Z', '2026-03-01T00:00:00.000Z')");
    lowEntry = Number(insert.run(quiet.code, 'Quiet supplier', 1).lastInsertRowid);
    goneEntry = Number(insert.run('S-NOT-IN-NETWORK', 'Old supplier', null).lastInsertRowid);
    // The owner's entry gets a stale rating, so the re-scoring changes it.
    sharedA = (sql().prepare("select id from register_entries where supplier_code = " +
      "'S-2-SHARED-A'").get() as { id: number }).id;
    sql().prepare("update register_entries set rating = 1, rating_band = 'low', owner_id = ? " +
      'where id = ?').run(t.userId('buyer@demo.test'), sharedA);
    const quietManager = insertUser(t.database.db, { email: 'risk.quiet@demo.test',
      name: 'Quiet Risk', role: 'risk_manager' });
    unsubscribe(t.database.db, quietManager, ['rescoring']);
    sql().prepare('delete from mail_messages').run();
  }, 60_000);

  it('answers 202, runs a quarterly analysis and succeeds with one score row per entry',
    async () => {
      const before = entryRows(t);
      const started = await postAs(t, '/api/rescoring', {});
      expect(started.status).toBe(202);
      expect(started.body).toMatchObject({ quarterLabel: '2026-Q1', networkVersionId: 1,
        trigger: 'manual', isForced: false, attempts: 1, status: 'queued',
        startedBy: { id: t.userId('risk@demo.test') } });
      first = await waitForRescoring(t, started.body.id);
      expect(first.status).toBe('succeeded');
      expect(first.progress).toBe(1);
      const run = await getAs(t, `/api/analysis-runs/${first.analysisRunId}`);
      expect(run.body).toMatchObject({ kind: 'quarterly', status: 'succeeded',
        label: 'Quarterly re-scoring 2026-Q1' });
      const after = entryRows(t);
      const scores = scoreRows(t, first.id);
      expect(scores.map((row) => row.entry_id)).toEqual(after.map((row) => row.id));
      expect(first.summary).toMatchObject({ rescored: before.length - 1,
        created: after.length - before.length, supplierRemoved: 1, noLongerMatters: 1,
        previousRescoringId: null });
      // Each score row carries the rating the entry had before this run.
      const byId = new Map(before.map((row) => [row.id, row]));
      for (const row of scores) {
        expect(row.previous_rating).toBe(byId.get(row.entry_id)?.rating ?? null);
        expect(row.rating).toBe(after.find((entry) => entry.id === row.entry_id)!.rating);
      }
      expect(first.summary!.ratingChanged).toBe(scores.filter((row) =>
        row.previous_rating !== null && row.previous_rating !== row.rating).length);
      expect(scores.find((row) => row.entry_id === sharedA)!.previous_rating).toBe(1);
      const audit = sql().prepare("select user_id, after from audit_events where action = " +
        "'rescoring.succeeded' and subject_id = ?").get(String(first.id)) as
        { user_id: number; after: string };
      expect(audit.user_id).toBe(t.userId('risk@demo.test'));
      expect(JSON.parse(audit.after)).toMatchObject({ quarterLabel: '2026-Q1',
        supplierRemoved: 1, noLongerMatters: 1 });
    }, 60_000);

  it('flags the entry whose supplier is gone and the low one that is no single point',
    () => {
      const flags = new Map(entryRows(t).map((row) => [row.id, row.flag]));
      expect(flags.get(goneEntry)).toBe('supplier_removed');
      expect(flags.get(lowEntry)).toBe('no_longer_matters');
      expect(flags.get(sharedA)).toBeNull();
      const gone = scoreRows(t, first.id).find((row) => row.entry_id === goneEntry)!;
      expect(gone).toMatchObject({ flag: 'supplier_removed', revenue_impact: null });
      expect(countOf(t, "audit_events where action = 'register.flag_changed'")).toBe(2);
    });

  it('e-mails the risk manager the summary and the owner their changed entry', async () => {
    const counted = await withMailsCounted(first.id);
    const mail = sql().prepare('select to_addresses, subject, text, html from mail_messages ' +
      'order by id').all() as { to_addresses: string; subject: string; text: string;
      html: string }[];
    expect(mail.map((message) => JSON.parse(message.to_addresses)[0]).sort())
      .toEqual(['buyer@demo.test', 'risk@demo.test']);
    expect(counted.summary!.mailsSent).toBe(2);
    const risk = mail.find((message) => message.to_addresses.includes('risk@demo.test'))!;
    expect(risk.subject).toMatch(/^Quarterly re-scoring 2026-Q1 finished: \d+ ratings changed/);
    expect(risk.text).toContain('"Old supplier" (supplier S-NOT-IN-NETWORK)');
    expect(risk.text).toContain('flagged: the supplier is no longer in the network');
    expect(risk.text).toContain(`http://keelson.test:4200/rescoring/compare?to=` +
      `${first.analysisRunId}`);
    expect(risk.html).toContain('&#34;Old supplier&#34;');
    const owner = mail.find((message) => message.to_addresses.includes('buyer@demo.test'))!;
    const shared = entryRows(t).find((row) => row.id === sharedA)!;
    expect(owner.text).toContain(`rating 1 (low) -> ${shared.rating} (${shared.rating_band})`);
    expect(owner.text).toContain(`http://keelson.test:4200/register/${sharedA}`);
    expect(owner.text).not.toContain('Old supplier');
  });

  it('refuses a second re-scoring of the quarter with 409 naming the first', async () => {
    const again = await postAs(t, '/api/rescoring', {});
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'quarter_taken',
      message: `2026-Q1 was re-scored already (re-scoring ${first.id}, succeeded); an ` +
        'administrator can force another.',
      details: { rescoringId: first.id, status: 'succeeded' } });
  });

  it('lets exactly one of two concurrent starts of a quarter through', async () => {
    const answers = await Promise.all([1, 2].map(() =>
      postAs(t, '/api/rescoring', { quarterLabel: '2026-Q2' })));
    expect(answers.map((answer) => answer.status).sort()).toEqual([202, 409]);
    expect(countOf(t, "rescoring_runs where quarter_label = '2026-Q2'")).toBe(1);
    const winner = answers.find((answer) => answer.status === 202)!;
    const done = await waitForRescoring(t, winner.body.id);
    expect(done.status).toBe('succeeded');
    expect(done.summary!.previousRescoringId).toBe(first.id);
    // Nothing changed since the first, so this one has no rating changes: only the risk
    // manager hears of it, with the comparison against the first.
    expect(done.summary!.ratingChanged).toBe(0);
    const counted = await withMailsCounted(done.id);
    const mail = sql().prepare('select to_addresses, text from mail_messages where text ' +
      "like '%re-scoring of 2026-Q2%'").all() as { to_addresses: string; text: string }[];
    expect(counted.summary!.mailsSent).toBe(1);
    expect(mail.map((message) => JSON.parse(message.to_addresses))).toEqual([
      ['risk@demo.test']]);
    expect(mail[0]!.text).toContain('No rating or flag changed.');
    expect(mail[0]!.text).toContain('http://keelson.test:4200/rescoring/compare?from=' +
      `${first.analysisRunId}&to=${done.analysisRunId}`);
  }, 60_000);

  it('lets an admin force another re-scoring of a taken quarter', async () => {
    const forced = await rescoreToEnd(t, { quarterLabel: '2026-Q1', force: true }, 'admin');
    expect(forced).toMatchObject({ quarterLabel: '2026-Q1', isForced: true,
      status: 'succeeded', startedBy: { id: t.userId('admin@demo.test') } });
    const list = await getAs(t, '/api/rescoring');
    expect(list.status).toBe(200);
    expect(list.body.items[0].id).toBe(forced.id);
    expect(list.body.total).toBe(3);
  }, 60_000);
});

describe('a supplier removed in a second network version', () => {
  it('flags its entry supplier_removed, and a re-scoring of the first version clears it',
    async () => {
      const model = await demoModel();
      const removed = 'S-2-SHARED-B';
      model.suppliers = model.suppliers.filter((supplier) => supplier.code !== removed);
      model.sourcing = model.sourcing.filter((row) => row.supplierCode !== removed &&
        row.buyerCode !== removed);
      const imported = await upload(t, await writeWorkbook(model), 'demo-changed.xlsx',
        { query: 'commit=true' });
      expect(imported.status).toBe(201);
      const latest = imported.body.networkVersionId as number;
      expect(latest).toBeGreaterThan(1);
      const entry = (sql().prepare('select id from register_entries where supplier_code = ?')
        .get(removed) as { id: number }).id;
      const q3 = await rescoreToEnd(t, { quarterLabel: '2026-Q3' });
      expect(q3).toMatchObject({ status: 'succeeded', networkVersionId: latest });
      expect(entryRows(t).find((row) => row.id === entry)!.flag).toBe('supplier_removed');
      expect(scoreRows(t, q3.id).find((row) => row.entry_id === entry)!.flag)
        .toBe('supplier_removed');
      const q4 = await rescoreToEnd(t, { quarterLabel: '2026-Q4', networkVersionId: 1 });
      expect(q4.status).toBe('succeeded');
      expect(entryRows(t).find((row) => row.id === entry)!.flag).toBeNull();
    }, 60_000);
});

describe('cancel', () => {
  it('cancels a running re-scoring and its analysis run, keeps no scores, frees the quarter',
    async () => {
      const big = insertTestVersion(t.database.db,
        generateTieredNetwork({ seed: 7, suppliers: 4000 }), { label: 'Large' });
      const started = await postAs(t, '/api/rescoring', { quarterLabel: '2025-Q1',
        networkVersionId: big });
      expect(started.status).toBe(202);
      const cancelled = await postAs(t, `/api/rescoring/${started.body.id}/cancel`, {});
      expect(cancelled.status).toBe(200);
      expect(cancelled.body.status).toBe('cancelled');
      expect((await waitForRun(t, started.body.analysisRunId)).status).toBe('cancelled');
      expect((await waitForRescoring(t, started.body.id)).status).toBe('cancelled');
      expect(scoreRows(t, started.body.id)).toEqual([]);
      const again = await postAs(t, `/api/rescoring/${started.body.id}/cancel`, {});
      expect(again.status).toBe(409);
      expect(again.body.error.code).toBe('rescoring_finished');
      expect((await postAs(t, `/api/rescoring/${started.body.id}/cancel`, {}, 'viewer'))
        .status).toBe(403);
      // A cancelled re-scoring holds no lock.
      const next = await rescoreToEnd(t, { quarterLabel: '2025-Q1', networkVersionId: 1 });
      expect(next.status).toBe('succeeded');
    }, 60_000);
});

describe('a restart', () => {
  const leaveRunning = (quarterLabel: string): number => {
    const stamp = '2026-03-02T08:30:00.000Z';
    const run = Number(sql().prepare("insert into analysis_runs (network_version_id, label, " +
      "kind, status, progress, created_at) values (1, 'Left running', 'quarterly', " +
      "'running', 0.4, ?)").run(stamp).lastInsertRowid);
    return Number(sql().prepare("insert into rescoring_runs (quarter_label, " +
      "network_version_id, analysis_run_id, status, trigger, attempts, created_at, " +
      "started_at) values (?, 1, ?, 'running', 'manual', 1, ?, ?)")
      .run(quarterLabel, run, stamp, stamp).lastInsertRowid);
  };

  it('marks re-scorings left running interrupted; resume reruns the same version',
    async () => {
      const resumed = leaveRunning('2024-Q1');
      const restarted = leaveRunning('2024-Q2');
      const app = createKeelsonApp({ config: t.config, db: t.database.db, mailer: t.mailer,
        logger: createLogger('silent') });
      await app.close();
      for (const id of [resumed, restarted]) {
        const left = (await getAs(t, `/api/rescoring/${id}`)).body as RescoringRunDto;
        expect(left).toMatchObject({ status: 'interrupted', error: INTERRUPTED_MESSAGE });
      }
      expect(countOf(t, "audit_events where action = 'rescoring.interrupted'")).toBe(2);
      // Interrupted keeps the quarter's lock.
      expect((await postAs(t, '/api/rescoring', { quarterLabel: '2024-Q1' })).status).toBe(409);
      const answer = await postAs(t, `/api/rescoring/${resumed}/resume`, { mode: 'resume' });
      expect(answer.status).toBe(202);
      expect(answer.body).toMatchObject({ status: 'queued', attempts: 2, networkVersionId: 1,
        error: null });
      const done = await waitForRescoring(t, resumed);
      expect(done.status).toBe('succeeded');
      expect(scoreRows(t, resumed).length).toBe(entryRows(t).length);
      const run = (await getAs(t, `/api/analysis-runs/${done.analysisRunId}`)).body;
      expect(run.label).toBe('Quarterly re-scoring 2024-Q1 (attempt 2)');
      const twice = await postAs(t, `/api/rescoring/${resumed}/resume`, {});
      expect(twice.status).toBe(409);
      expect(twice.body.error.code).toBe('rescoring_not_resumable');
    }, 60_000);

  it('restart reruns an interrupted re-scoring on the latest network version', async () => {
    const id = (sql().prepare("select id from rescoring_runs where quarter_label = '2024-Q2'")
      .get() as { id: number }).id;
    const latest = (sql().prepare('select max(id) as id from network_versions').get() as
      { id: number }).id;
    expect(latest).toBeGreaterThan(1);
    expect((await postAs(t, `/api/rescoring/${id}/resume`, { mode: 'restart' }, 'buyer'))
      .status).toBe(403);
    const bad = await postAs(t, `/api/rescoring/${id}/resume`, { mode: 'again' });
    expect(bad.body.error.details.issues[0].path).toBe('body.mode');
    const answer = await postAs(t, `/api/rescoring/${id}/resume`, { mode: 'restart' });
    expect(answer.body).toMatchObject({ networkVersionId: latest, attempts: 2 });
    // The large cancelled version above is the latest: cancel rather than wait for it.
    const cancelled = await postAs(t, `/api/rescoring/${id}/cancel`, {});
    expect(cancelled.body.status).toBe('cancelled');
    const audit = sql().prepare("select before, after from audit_events where action = " +
      "'rescoring.restarted' and subject_id = ?").get(String(id)) as
      { before: string; after: string };
    expect(JSON.parse(audit.before)).toMatchObject({ status: 'interrupted',
      networkVersionId: 1 });
    expect(JSON.parse(audit.after)).toMatchObject({ networkVersionId: latest, attempts: 2 });
  }, 60_000);

  it('answers 404 for an unknown re-scoring', async () => {
    expect((await getAs(t, '/api/rescoring/9999')).status).toBe(404);
    expect((await postAs(t, '/api/rescoring/9999/resume', {})).status).toBe(404);
  });
});
