/**
 * The life of an analysis run through the API on the demo network (imported as version 1):
 * start (202), the progress stream, success with totals and timings, register entries for the
 * demo's hidden tier-2 single points of failure (S-2-SHARED-A and S-2-SHARED-B, built on purpose
 * by tools/demo-network.ts), roles, cancel (queued and running), a failing worker and a failing
 * store leaving no rows, and a restart failing runs left running.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AnalysisRunDto, Role } from '@keelson/contracts';
import { analysisRuns } from '@keelson/db';
import { analyse } from '@keelson/supply-graph';
import { generateTieredNetwork } from '@keelson/supply-graph/testing';
import { runAnalysisInWorker } from '../analysis/run-analysis-in-worker';
import { createKeelsonApp } from '../app';
import { insertTestVersion } from '../network/network-test-versions';
import { readNetworkModel } from '../network/network-store';
import { createTestApp, type TestApp } from '../testing/test-app';
import { RunQueue } from './run-queue';
import {
  getAs,
  postAs,
  progressEvents,
  runToEnd,
  streamText,
  waitForRun,
} from './run-spec-helpers';
import { RESTART_MESSAGE, RunsService } from './runs.service';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
}, 60_000);
afterAll(() => t.close());

const resultRows = (runId: number) => (t.database.sqlite
  .prepare('select count(*) as n from run_suppliers where run_id = ?').get(runId) as
  { n: number }).n;

describe('POST /api/analysis-runs and the progress stream', () => {
  let run: AnalysisRunDto;

  it('answers 202 with the id, streams progress to succeeded, and stores every row',
    async () => {
      const cookie = await t.signIn('risk@demo.test');
      const started = await request(t.app).post('/api/analysis-runs')
        .set(t.cookieHeaders(cookie)).send({ networkVersionId: 1, label: 'First look' });
      expect(started.status).toBe(202);
      expect(started.body).toEqual({ id: expect.any(Number) });
      const id = started.body.id as number;
      // EventSource sends the cookie and no CSRF header; a GET needs none.
      const stream = await request(t.app).get(`/api/analysis-runs/${id}/events`)
        .set('Cookie', cookie).buffer(true).parse(streamText);
      expect(stream.status).toBe(200);
      expect(stream.headers['content-type']).toMatch(/^text\/event-stream/);
      const events = progressEvents(stream.body as string);
      // The stream opens while the worker thread is still starting, so it sees it run.
      expect(events.some((event) => event.status === 'running')).toBe(true);
      expect(events.at(-1)).toEqual({ id, status: 'succeeded', progress: 1, stage: null,
        error: null });
      const fractions = events.map((event) => event.progress);
      fractions.slice(1).forEach((f, i) => expect(f).toBeGreaterThanOrEqual(fractions[i]!));
      run = await waitForRun(t, id);
      expect(run.status).toBe('succeeded');
      expect(run.totals?.suppliers).toBe(148);
      expect(run.timings?.total).toBeGreaterThan(0);
      expect(run.methods).toEqual({ closeness: { method: 'exact' } });
      expect(run.createdBy).toEqual({ id: t.userId('risk@demo.test'), name: expect.any(String) });
      expect(resultRows(id)).toBe(148);
    }, 60_000);

  it('stores the totals of the engine and a copy of the scoring settings', async () => {
    const model = readNetworkModel(t.database.db, 1)!;
    const local = analyse(model);
    expect(run.totals).toEqual(local.totals);
    const row = t.database.db.select().from(analysisRuns).all().find((r) => r.id === run.id)!;
    expect(row.scoringSettings).toMatchObject({ impactBandLimits: [0.001, 0.005, 0.02, 0.05] });
  });

  it('finds the hidden tier-2 single points of failure and opens register entries for them',
    async () => {
      const page = await getAs(t, `/api/analysis-runs/${run.id}/suppliers?tier=2` +
        '&singlePointsOnly=true&limit=1000');
      expect(page.status).toBe(200);
      const shared = (page.body.items as { code: string }[])
        .filter((item) => item.code.startsWith('S-2-SHARED')).map((item) => item.code);
      expect(shared).toEqual(expect.arrayContaining(['S-2-SHARED-A', 'S-2-SHARED-B']));
      const entries = t.database.sqlite.prepare(
        "select supplier_code, origin, run_id, title from register_entries " +
        "where supplier_code like 'S-2-SHARED-%' order by supplier_code").all();
      expect(entries).toEqual([
        { supplier_code: 'S-2-SHARED-A', origin: 'automatic', run_id: run.id,
          title: expect.stringMatching(/^Single point of failure: /) },
        { supplier_code: 'S-2-SHARED-B', origin: 'automatic', run_id: run.id,
          title: expect.stringMatching(/^Single point of failure: /) },
      ]);
    });

  it('gives a finished run one final event and then ends the stream', async () => {
    const stream = await getAs(t, `/api/analysis-runs/${run.id}/events`)
      .buffer(true).parse(streamText);
    expect(progressEvents(stream.body as string)).toEqual([
      { id: run.id, status: 'succeeded', progress: 1, stage: null, error: null },
    ]);
  });

  it('lists runs newest first, filtered by version, and pages', async () => {
    const second = await runToEnd(t, 1, 'Second look');
    const list = await getAs(t, '/api/analysis-runs?limit=1');
    expect(list.body.total).toBeGreaterThanOrEqual(2);
    expect(list.body.items.map((r: AnalysisRunDto) => r.id)).toEqual([second.id]);
    const none = await getAs(t, '/api/analysis-runs?networkVersionId=999');
    expect(none.body).toEqual({ items: [], total: 0 });
    const bad = await getAs(t, '/api/analysis-runs?limit=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('query.limit');
  }, 60_000);
});

describe('who may start runs', () => {
  it.each<Role>(['buyer', 'viewer', 'plant_manager'])('refuses a %s with 403', async (role) => {
    const response = await postAs(t, '/api/analysis-runs', { networkVersionId: 1, label: 'x' },
      role);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });
  it('lets an admin start one, and says which version is missing or which field is wrong',
    async () => {
      expect((await postAs(t, '/api/analysis-runs', { networkVersionId: 77, label: 'x' },
        'admin')).body.error.message).toMatch(/no network version 77/);
      const bad = await postAs(t, '/api/analysis-runs', { networkVersionId: 1, label: '' });
      expect(bad.status).toBe(400);
      expect(bad.body.error.details.issues[0].path).toBe('body.label');
    });
  it('needs the CSRF header with the cookie', async () => {
    const cookie = await t.signIn('risk@demo.test');
    const response = await request(t.app).post('/api/analysis-runs').set('Cookie', cookie)
      .send({ networkVersionId: 1, label: 'no header' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf_missing');
  });
  it('answers 404 for an unknown run', async () => {
    expect((await getAs(t, '/api/analysis-runs/9999')).status).toBe(404);
    expect((await getAs(t, '/api/analysis-runs/9999/events')).status).toBe(404);
  });
});

describe('cancel', () => {
  it('cancels a running run and the run queued behind it, and keeps no rows', async () => {
    const big = insertTestVersion(t.database.db,
      generateTieredNetwork({ seed: 31, suppliers: 6000 }), { label: 'Large' });
    const first = (await postAs(t, '/api/analysis-runs', { networkVersionId: big,
      label: 'Long' })).body.id as number;
    const second = (await postAs(t, '/api/analysis-runs', { networkVersionId: 1,
      label: 'Waits' })).body.id as number;
    // One run at a time: the second waits while the first runs.
    for (;;) {
      const current = (await getAs(t, `/api/analysis-runs/${first}`)).body as AnalysisRunDto;
      if (current.status === 'running' && current.progress > 0) break;
      expect(current.status).toMatch(/queued|running/);
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect((await getAs(t, `/api/analysis-runs/${second}`)).body.status).toBe('queued');
    const cancelledSecond = await postAs(t, `/api/analysis-runs/${second}/cancel`, {});
    expect(cancelledSecond.status).toBe(200);
    expect(cancelledSecond.body.status).toBe('cancelled');
    const cancelledFirst = await postAs(t, `/api/analysis-runs/${first}/cancel`, {});
    expect(cancelledFirst.body.status).toBe('cancelled');
    expect((await waitForRun(t, first)).status).toBe('cancelled');
    const again = await postAs(t, `/api/analysis-runs/${first}/cancel`, {});
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('run_finished');
    expect(resultRows(first)).toBe(0);
    expect(resultRows(second)).toBe(0);
    const results = await getAs(t, `/api/analysis-runs/${first}/suppliers`);
    expect(results.status).toBe(409);
    expect(results.body.error.code).toBe('run_not_ready');
    // The queue keeps turning after a cancel.
    expect((await runToEnd(t, 1, 'After cancel')).status).toBe('succeeded');
  }, 120_000);
  it('refuses cancel to buyers', async () => {
    expect((await postAs(t, '/api/analysis-runs/1/cancel', {}, 'buyer')).status).toBe(403);
  });
});

describe('failures leave nothing partial', () => {
  const service = (analyser: ConstructorParameters<typeof RunsService>[0]['analyser']) =>
    new RunsService({ db: t.database.db, now: () => t.clock.now, analyser,
      queue: new RunQueue() });

  it('stores the error of a worker that fails, and no rows', async () => {
    const runs = service(async (_model, _options, hooks) => {
      hooks?.onProgress?.(0.4, 'betweenness');
      throw new Error('worker ran out of memory');
    });
    const { id } = runs.start(null, { networkVersionId: 1, label: 'Doomed' });
    const run = await runs.settled(id);
    expect(run.status).toBe('failed');
    expect(run.error).toBe('The analysis failed: worker ran out of memory');
    expect(resultRows(id)).toBe(0);
    const api = await getAs(t, `/api/analysis-runs/${id}`);
    expect(api.body.status).toBe('failed');
  });

  it('stores the error a real worker thread sends back, and no rows', async () => {
    // The worker is asked for a scenario of a supplier that does not exist, so the engine in
    // the thread throws UnknownSupplierError after the thread has started.
    const runs = service((model, _options, hooks) =>
      runAnalysisInWorker(model, { fail: ['NO-SUCH-SUPPLIER'] }, hooks));
    const { id } = runs.start(null, { networkVersionId: 1, label: 'Bad scenario' });
    const run = await runs.settled(id);
    expect(run.status).toBe('failed');
    expect(run.error).toMatch(/^The analysis failed: .*NO-SUCH-SUPPLIER/);
    expect(resultRows(id)).toBe(0);
  }, 60_000);

  it('rolls back every row and register change when storing fails half way', async () => {
    const model = readNetworkModel(t.database.db, 1)!;
    const runs = service(async () => {
      const result = analyse(model);
      // A repeated supplier breaks the primary key after 148 rows have been written.
      return { ...result, suppliers: [...result.suppliers, result.suppliers[0]!] };
    });
    const { id } = runs.start(null, { networkVersionId: 1, label: 'Broken store' });
    const run = await runs.settled(id);
    expect(run.status).toBe('failed');
    expect(run.error).toMatch(/UNIQUE|PRIMARY KEY/i);
    expect(resultRows(id)).toBe(0);
    expect(t.database.sqlite.prepare('select count(*) as n from register_entries where run_id = ?')
      .get(id)).toEqual({ n: 0 });
  });
});

describe('a restart', () => {
  it('marks runs left queued or running as failed with a clear message', async () => {
    const stamp = '2026-03-02T08:30:00.000Z';
    const insert = t.database.sqlite.prepare('insert into analysis_runs (network_version_id, ' +
      "label, kind, status, progress, created_at) values (1, ?, 'manual', ?, 0.3, ?)");
    const running = Number(insert.run('Left running', 'running', stamp).lastInsertRowid);
    const queued = Number(insert.run('Left queued', 'queued', stamp).lastInsertRowid);
    createKeelsonApp({ config: t.config, db: t.database.db, mailer: t.mailer,
      logger: (await import('../http/request-logging')).createLogger('silent') });
    for (const id of [running, queued]) {
      const run = (await getAs(t, `/api/analysis-runs/${id}`)).body as AnalysisRunDto;
      expect(run.status).toBe('failed');
      expect(run.error).toBe(RESTART_MESSAGE);
    }
  });
});
