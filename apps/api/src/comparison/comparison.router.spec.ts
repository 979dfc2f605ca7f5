/**
 * GET /api/comparison and its export, end to end: the demo imported (Q1), analysed; the next
 * quarter's demo (data/demo/keelson-demo-q2.xlsx, changes listed in tools/demo-network-q2.ts)
 * imported through the API and analysed; the comparison shows exactly those changes. Also the
 * defaults, plant managers' scope, refusals and the workbook.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ComparisonRowDto, RunComparisonDto } from '@keelson/contracts';
import { downloadWorkbook } from '../imports/import-fixtures';
import { getAs, runToEnd } from '../runs/run-spec-helpers';
import { createTestApp, type TestApp } from '../testing/test-app';
import { COMPARISON_EXPORT_COLUMNS, COMPARISON_SECTIONS } from './comparison-export';
import { importDemoQ2, insertRescoring, markQuarterly } from './comparison-test-fixtures';

// The expected changes, as tools/demo-network-q2.ts documents them (Q2_CHANGES.expected).
const EXPECTED = {
  newSinglePoints: ['S-1-096'],
  goneSinglePoints: ['S-2-SHARED-B'],
  suppliersAdded: ['S-1-096'],
  suppliersRemoved: ['S-2-003'],
};

let t: TestApp;
let q1Run: number;
let q2Run: number;
let noRunsYet: request.Response;
let oneRunOnly: request.Response;

const codes = (rows: ComparisonRowDto[]) => rows.map((row) => row.code).sort();
const bearer = (email: string) => ({ Authorization: `Bearer ${t.tokenFor(email)}` });

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  noRunsYet = await getAs(t, '/api/comparison');
  t.clock.now = new Date('2026-03-02T10:00:00.000Z');
  q1Run = (await runToEnd(t, 1, 'Q1')).id;
  oneRunOnly = await getAs(t, '/api/comparison');
  t.clock.now = new Date('2026-06-01T10:00:00.000Z');
  const q2Version = await importDemoQ2(t);
  q2Run = (await runToEnd(t, q2Version, 'Q2')).id;
}, 120_000);

afterAll(async () => {
  await t.close();
});

describe('GET /api/comparison: Q1 against Q2 of the demo', () => {
  it('shows exactly the new and gone single points and the suppliers added and removed',
    async () => {
      const response = await getAs(t, `/api/comparison?from=${q1Run}&to=${q2Run}`, 'risk_manager');
      expect(response.status).toBe(200);
      const body = response.body as RunComparisonDto;
      expect(body.fromRun).toMatchObject({ id: q1Run, label: 'Q1', networkVersionId: 1,
        quarterLabel: null });
      expect(body.toRun).toMatchObject({ id: q2Run, label: 'Q2', quarterLabel: null });
      expect(codes(body.newSinglePoints)).toEqual(EXPECTED.newSinglePoints);
      expect(codes(body.goneSinglePoints)).toEqual(EXPECTED.goneSinglePoints);
      expect(codes(body.suppliersAdded)).toEqual(EXPECTED.suppliersAdded);
      expect(codes(body.suppliersRemoved)).toEqual(EXPECTED.suppliersRemoved);
      const added = body.suppliersAdded[0]!;
      expect(added).toMatchObject({ name: 'Eskar Seal Systems', tier: 1, before: null });
      expect(added.after).toMatchObject({ singlePointOfFailure: true });
      // The new supplier's impact: F-107 (P-NORTH, 84 250 a week) lost for its 12 weeks.
      expect(added.after!.revenueImpact).toBe(84_250 * 12);
      expect(added.revenueImpactChange).toBe(84_250 * 12);
      expect(body.goneSinglePoints[0]!.before!.singlePointOfFailure).toBe(true);
      expect(body.goneSinglePoints[0]!.after!.singlePointOfFailure).toBe(false);
      expect(body.suppliersRemoved[0]).toMatchObject({ after: null, name: 'Álvarez-Roca Motors' });
    });

  it('ranks risers and fallers by rating change, then revenue impact change, then code',
    async () => {
      const body = (await getAs(t, `/api/comparison?from=${q1Run}&to=${q2Run}`)).body as
        RunComparisonDto;
      const expected = moversFromTables(t, q1Run, q2Run);
      expect(body.risers.map((row) => row.code)).toEqual(expected.risers);
      expect(body.fallers.map((row) => row.code)).toEqual(expected.fallers);
      expect(body.risers.length).toBeGreaterThan(0);
      for (const row of [...body.risers, ...body.fallers]) {
        expect(row.ratingChange).toBe(row.after!.rating - row.before!.rating);
      }
    });

  it('says what to do when no run, or only one, has succeeded', () => {
    expect(noRunsYet.status).toBe(404);
    expect(noRunsYet.body.error.message).toContain('start an analysis run');
    expect(oneRunOnly.status).toBe(409);
    expect(oneRunOnly.body.error).toMatchObject({ code: 'comparison_needs_two_runs',
      details: { runId: q1Run } });
    expect(oneRunOnly.body.error.message).toContain('Start another analysis run');
  });

  it('refuses unknown, unfinished and equal runs, naming the field', async () => {
    const unknown = await getAs(t, `/api/comparison?from=9999&to=${q2Run}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toBe('query.from: analysis run 9999 was not found.');
    const failed = t.database.sqlite.prepare("INSERT INTO analysis_runs (network_version_id, " +
      "label, kind, status, error, created_at) VALUES (1, 'Broken', 'manual', 'failed', " +
      "'boom', '2026-03-03T00:00:00.000Z')").run().lastInsertRowid;
    const notSucceeded = await getAs(t, `/api/comparison?from=${q1Run}&to=${failed}`);
    expect(notSucceeded.status).toBe(409);
    expect(notSucceeded.body.error.message).toBe(`query.to: analysis run ${failed} is failed; ` +
      'only a succeeded run has results to compare.');
    const same = await getAs(t, `/api/comparison?from=${q1Run}&to=${q1Run}`);
    expect(same.status).toBe(400);
    expect(same.body.error.details.issues[0].path).toBe('query.to');
    const bad = await getAs(t, '/api/comparison?from=abc');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('query.from');
  });

  it('needs a session, and answers every role', async () => {
    for (const path of ['/api/comparison', '/api/comparison/export.xlsx',
      '/api/comparison/trends', '/api/comparison/entries/1/scores']) {
      expect((await request(t.app).get(path)).status).toBe(401);
    }
    for (const role of ['admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer'] as const) {
      expect((await getAs(t, `/api/comparison?from=${q1Run}&to=${q2Run}`, role)).status)
        .toBe(200);
    }
  });
});

describe('GET /api/comparison for plant managers', () => {
  it('keeps only suppliers whose lost products reach their plants in either run', async () => {
    const south = (await request(t.app).get(`/api/comparison?from=${q1Run}&to=${q2Run}`)
      .set(bearer('plant.south@demo.test'))).body as RunComparisonDto;
    // S-1-096 loses a P-NORTH product only; S-2-SHARED-B reached P-SOUTH in Q1.
    expect(codes(south.newSinglePoints)).toEqual([]);
    expect(codes(south.goneSinglePoints)).toEqual(['S-2-SHARED-B']);
    // S-2-003 lost no product in Q1 (every buyer had another source), so it reaches no plant.
    expect(codes(south.suppliersRemoved)).toEqual([]);
    const north = (await request(t.app).get(`/api/comparison?from=${q1Run}&to=${q2Run}`)
      .set(bearer('plant.north@demo.test'))).body as RunComparisonDto;
    expect(codes(north.newSinglePoints)).toEqual(['S-1-096']);
    expect(codes(north.suppliersAdded)).toEqual(['S-1-096']);
    const plantsOf = t.database.sqlite.prepare('SELECT DISTINCT plant_code FROM ' +
      'run_supplier_plants WHERE code = ? AND run_id IN (?, ?)');
    for (const row of [...north.risers, ...north.fallers, ...north.goneSinglePoints]) {
      expect((plantsOf.raw().all(row.code, q1Run, q2Run) as string[][]).flat())
        .toContain('P-NORTH');
    }
  });
});

describe('GET /api/comparison defaults', () => {
  it('falls back to the last two succeeded runs of any kind, then prefers quarterly runs',
    async () => {
      const anyKind = (await getAs(t, '/api/comparison')).body as RunComparisonDto;
      expect([anyKind.fromRun.id, anyKind.toRun.id]).toEqual([q1Run, q2Run]);
      t.clock.now = new Date('2026-06-02T10:00:00.000Z');
      const later = (await runToEnd(t, 1, 'Manual rerun of Q1')).id;
      const lastTwo = (await getAs(t, '/api/comparison')).body as RunComparisonDto;
      expect([lastTwo.fromRun.id, lastTwo.toRun.id]).toEqual([q2Run, later]);
      markQuarterly(t, q1Run, q2Run);
      insertRescoring(t, { quarterLabel: '2026-Q1', analysisRunId: q1Run,
        finishedAt: '2026-03-02T10:05:00.000Z' });
      insertRescoring(t, { quarterLabel: '2026-Q2', analysisRunId: q2Run,
        finishedAt: '2026-06-01T10:05:00.000Z' });
      const quarterly = (await getAs(t, '/api/comparison')).body as RunComparisonDto;
      expect(quarterly.fromRun).toMatchObject({ id: q1Run, quarterLabel: '2026-Q1' });
      expect(quarterly.toRun).toMatchObject({ id: q2Run, quarterLabel: '2026-Q2' });
      // Only one side given: the nearest succeeded run of the same kind.
      const toOnly = (await getAs(t, `/api/comparison?to=${q2Run}`)).body as RunComparisonDto;
      expect(toOnly.fromRun.id).toBe(q1Run);
      const fromOnly = (await getAs(t, `/api/comparison?from=${q2Run}`)).body as
        RunComparisonDto;
      expect(fromOnly.toRun.id).toBe(later);
      const nothingLater = await getAs(t, `/api/comparison?from=${later}`);
      expect(nothingLater.status).toBe(409);
      expect(nothingLater.body.error.message).toContain('give query.to');
    });
});

describe('GET /api/comparison/export.xlsx', () => {
  it('has one sheet per section with the rows of the comparison, and an About sheet',
    async () => {
      const path = `/api/comparison/export.xlsx?from=${q1Run}&to=${q2Run}`;
      const { response, workbook } = await downloadWorkbook(t, path, 'viewer@demo.test');
      expect(response.status).toBe(200);
      expect(response.headers['content-disposition'])
        .toContain(`keelson-comparison-${q1Run}-${q2Run}.xlsx`);
      expect(workbook.worksheets.map((sheet) => sheet.name))
        .toEqual([...COMPARISON_SECTIONS.map((section) => section.sheet), 'About']);
      const body = (await getAs(t, `/api/comparison?from=${q1Run}&to=${q2Run}`)).body as
        RunComparisonDto;
      for (const section of COMPARISON_SECTIONS) {
        const sheet = workbook.getWorksheet(section.sheet)!;
        expect((sheet.getRow(1).values as unknown[]).slice(1))
          .toEqual([...COMPARISON_EXPORT_COLUMNS]);
        const sheetCodes: string[] = [];
        sheet.eachRow((row, number) => {
          if (number > 1) sheetCodes.push(String(row.getCell(1).value));
        });
        expect(sheetCodes).toEqual(body[section.field].map((row) => row.code));
      }
      const added = workbook.getWorksheet('Suppliers added')!.getRow(2);
      expect(added.getCell(1).value).toBe('S-1-096');
      expect(added.getCell(4).value).toBe('');
      expect(added.getCell(13).value).toBe('yes');
      const about: string[] = [];
      workbook.getWorksheet('About')!.eachRow((row) => about.push(String(row.getCell(1).value)));
      expect(about.join('\n')).toContain('decision support');
      expect(about.join('\n')).toContain(`Earlier: run ${q1Run} "Q1"`);
      expect(about.some((line) => line.startsWith('New single points (1): '))).toBe(true);
    });

  it('refuses what the comparison refuses', async () => {
    const response = await getAs(t, '/api/comparison/export.xlsx?from=9999');
    expect(response.status).toBe(404);
  });
});

/**
 * Risers and fallers computed from the two runs' stored rows in SQL, independently of the
 * service: suppliers in both runs, rating change first, then revenue impact change, then code.
 */
function moversFromTables(app: TestApp, from: number, to: number) {
  const rows = app.database.sqlite.prepare('SELECT a.code AS code, b.rating - a.rating AS r, ' +
    'round(b.revenue_impact - a.revenue_impact, 2) AS v FROM run_suppliers a JOIN run_suppliers ' +
    'b ON b.code = a.code AND b.run_id = ? WHERE a.run_id = ?').all(to, from) as
    { code: string; r: number; v: number }[];
  const risers = rows.filter((row) => row.r > 0 || (row.r === 0 && row.v > 0))
    .sort((a, b) => b.r - a.r || b.v - a.v || (a.code < b.code ? -1 : 1)).slice(0, 20);
  const fallers = rows.filter((row) => row.r < 0 || (row.r === 0 && row.v < 0))
    .sort((a, b) => a.r - b.r || a.v - b.v || (a.code < b.code ? -1 : 1)).slice(0, 20);
  return { risers: risers.map((row) => row.code), fallers: fallers.map((row) => row.code) };
}
