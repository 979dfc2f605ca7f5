/**
 * GET /api/comparison/trends and GET /api/comparison/entries/:entryId/scores. The demo's two
 * quarters are analysed through the API; the re-scorings and their entry scores are written
 * straight into the tables (comparison-test-fixtures.ts), as the re-scoring feature writes them.
 * The expected totals come from the engine run here on the same workbooks (`analyse` of
 * @keelson/supply-graph, as `npm run analyze` does), not from the stored rows.
 */
import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  EntryScoreDto, RatingBand, RescoringTrendsDto, SupplyModel,
} from '@keelson/contracts';
import { analyse } from '@keelson/supply-graph';
import { readWorkbook } from '@keelson/workbook';
import { demoModel, getAs, runToEnd } from '../runs/run-spec-helpers';
import { createTestApp, type TestApp } from '../testing/test-app';
import { DEMO_Q2_WORKBOOK_PATH, importDemoQ2, insertRescoring } from './comparison-test-fixtures';

let t: TestApp;
let q1Run: number;
let q2Run: number;
let entries: { id: number; plants: string[] }[];
let q1Rescoring: number;
let q2Rescoring: number;
let emptyTrends: request.Response;

const Q1_BANDS: RatingBand[] = ['critical', 'high', 'high', 'medium', 'low', 'critical'];
const Q2_BANDS: RatingBand[] = ['high', 'high', 'low', 'critical', 'critical', 'medium'];

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  t.clock.now = new Date('2026-03-02T10:00:00.000Z');
  q1Run = (await runToEnd(t, 1, 'Q1')).id;
  emptyTrends = await getAs(t, '/api/comparison/trends');
  t.clock.now = new Date('2026-06-01T10:00:00.000Z');
  q2Run = (await runToEnd(t, await importDemoQ2(t), 'Q2')).id;
  const rows = t.database.sqlite.prepare('SELECT e.id AS id, group_concat(p.plant_code) AS ' +
    'plants FROM register_entries e LEFT JOIN register_entry_plants p ON p.entry_id = e.id ' +
    'GROUP BY e.id ORDER BY e.id LIMIT 6').all() as { id: number; plants: string | null }[];
  entries = rows.map((row) => ({ id: row.id, plants: row.plants?.split(',') ?? [] }));
  const scores = (bands: RatingBand[]) =>
    Object.fromEntries(entries.slice(0, bands.length)
      .map((entry, index) => [entry.id, bands[index]!]));
  // Inserted out of order: the trends sort by when each re-scoring finished.
  q2Rescoring = insertRescoring(t, { quarterLabel: '2026-Q2', analysisRunId: q2Run,
    finishedAt: '2026-06-01T10:05:00.000Z', scores: scores(Q2_BANDS) });
  q1Rescoring = insertRescoring(t, { quarterLabel: '2026-Q1', analysisRunId: q1Run,
    finishedAt: '2026-03-02T10:05:00.000Z', scores: scores(Q1_BANDS) });
  insertRescoring(t, { quarterLabel: '2026-Q3', analysisRunId: q2Run, status: 'failed',
    finishedAt: '2026-09-07T06:05:00.000Z', scores: scores(['critical', 'critical']) });
}, 120_000);

afterAll(async () => {
  await t.close();
});

async function q2Model(): Promise<SupplyModel> {
  const read = await readWorkbook(new Uint8Array(readFileSync(DEMO_Q2_WORKBOOK_PATH)));
  if (!read.model) throw new Error('The Q2 demo workbook did not read.');
  return read.model;
}

/** The engine's totals of a model, over every plant or over `plants` only. */
function engineTotals(model: SupplyModel, plants: string[] | null) {
  const suppliers = analyse(model).suppliers;
  let revenue = 0;
  let spofs = 0;
  for (const supplier of suppliers) {
    const products = supplier.products.filter((p) => plants === null
      || plants.includes(p.plantCode));
    revenue += products.reduce((sum, p) => sum + p.weeklyRevenue * p.lostWeeks, 0);
    if (supplier.singlePointOfFailure && (plants === null || products.length > 0)) spofs++;
  }
  return { revenue, spofs };
}

function bandCounts(bands: RatingBand[], plant: string | null) {
  const kept = entries.map((entry, index) => ({ entry, band: bands[index]! }))
    .filter(({ entry }) => plant === null || entry.plants.includes(plant));
  return { high: kept.filter((k) => k.band === 'high').length,
    critical: kept.filter((k) => k.band === 'critical').length };
}

describe('GET /api/comparison/trends', () => {
  it('is empty before any re-scoring has succeeded', () => {
    expect(emptyTrends.status).toBe(200);
    expect(emptyTrends.body).toEqual({ items: [] });
  });

  it('gives each succeeded re-scoring, oldest first, its run totals and entry bands',
    async () => {
      expect(entries).toHaveLength(6);
      const body = (await getAs(t, '/api/comparison/trends', 'risk_manager')).body as
        RescoringTrendsDto;
      expect(body.items.map((item) => [item.quarterLabel, item.rescoringId, item.analysisRunId]))
        .toEqual([['2026-Q1', q1Rescoring, q1Run], ['2026-Q2', q2Rescoring, q2Run]]);
      const expected = [engineTotals(await demoModel(), null),
        engineTotals(await q2Model(), null)];
      body.items.forEach((item, index) => {
        expect(item.totalRevenueImpact).toBeCloseTo(expected[index]!.revenue, 2);
        expect(item.singlePointsOfFailure).toBe(expected[index]!.spofs);
      });
      // 81 single points in both quarters: one new (S-1-096), one gone (S-2-SHARED-B).
      expect(body.items.map((item) => item.singlePointsOfFailure)).toEqual([81, 81]);
      expect(body.items.map((item) => [item.highEntries, item.criticalEntries])).toEqual(
        [bandCounts(Q1_BANDS, null), bandCounts(Q2_BANDS, null)]
          .map((counts) => [counts.high, counts.critical]));
      expect(body.items[0]).toMatchObject({ highEntries: 2, criticalEntries: 2 });
    });

  it('counts only a plant manager\'s plants: their products\' lost revenue, their entries',
    async () => {
      const response = await request(t.app).get('/api/comparison/trends')
        .set('Authorization', `Bearer ${t.tokenFor('plant.south@demo.test')}`);
      const body = response.body as RescoringTrendsDto;
      const expected = [engineTotals(await demoModel(), ['P-SOUTH']),
        engineTotals(await q2Model(), ['P-SOUTH'])];
      expect(body.items).toHaveLength(2);
      body.items.forEach((item, index) => {
        expect(item.totalRevenueImpact).toBeCloseTo(expected[index]!.revenue, 2);
        expect(item.singlePointsOfFailure).toBe(expected[index]!.spofs);
        const bands = bandCounts(index === 0 ? Q1_BANDS : Q2_BANDS, 'P-SOUTH');
        expect([item.highEntries, item.criticalEntries]).toEqual([bands.high, bands.critical]);
      });
      const all = (await getAs(t, '/api/comparison/trends')).body as RescoringTrendsDto;
      expect(body.items[0]!.totalRevenueImpact).toBeLessThan(all.items[0]!.totalRevenueImpact);
    });
});

describe('GET /api/comparison/entries/:entryId/scores', () => {
  it('lists an entry\'s score at each succeeded re-scoring, oldest first', async () => {
    const entry = entries[0]!;
    const response = await getAs(t, `/api/comparison/entries/${entry.id}/scores`);
    expect(response.status).toBe(200);
    const scores = response.body as EntryScoreDto[];
    expect(scores.map((s) => [s.quarterLabel, s.rescoringId, s.ratingBand, s.rating])).toEqual([
      ['2026-Q1', q1Rescoring, 'critical', 20], ['2026-Q2', q2Rescoring, 'high', 12]]);
    expect(scores[0]).toMatchObject({ previousRating: null, revenueImpact: 20_000, flag: null,
      createdAt: '2026-03-02T10:05:00.000Z' });
  });

  it('answers 404 for an entry outside a plant manager\'s plants, or none, and 400 for a ' +
    'bad id', async () => {
    const outside = entries.find((entry) => !entry.plants.includes('P-NORTH'));
    expect(outside).toBeDefined();
    const refused = await getAs(t, `/api/comparison/entries/${outside!.id}/scores`,
      'plant_manager');
    expect(refused.status).toBe(404);
    expect(refused.body.error.message).toBe(`Register entry ${outside!.id} was not found.`);
    const inside = entries.find((entry) => entry.plants.includes('P-NORTH'));
    expect((await getAs(t, `/api/comparison/entries/${inside!.id}/scores`, 'plant_manager'))
      .body).toHaveLength(2);
    expect((await getAs(t, '/api/comparison/entries/99999/scores')).status).toBe(404);
    const bad = await getAs(t, '/api/comparison/entries/abc/scores');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('params.entryId');
  });
});
