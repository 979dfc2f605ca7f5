/**
 * The check with real quarterly re-scorings: the demo (Q1) re-scored, the next quarter's
 * demo (data/demo/keelson-demo-q2.xlsx, changes in tools/demo-network-q2.ts) imported and
 * re-scored (Q2); the default comparison is Q2 against Q1 and shows exactly those changes, and
 * the trends and an entry's scores read what the re-scorings wrote.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  ComparisonRowDto, EntryScoreDto, RescoringRunDto, RescoringTrendsDto, RunComparisonDto,
} from '@keelson/contracts';
import { rescoreToEnd } from '../rescoring/rescoring-spec-helpers';
import { getAs } from '../runs/run-spec-helpers';
import { createTestApp, type TestApp } from '../testing/test-app';
import { importDemoQ2 } from './comparison-test-fixtures';

let t: TestApp;
let q1: RescoringRunDto;
let q2: RescoringRunDto;

const codes = (rows: ComparisonRowDto[]) => rows.map((row) => row.code).sort();

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  t.clock.now = new Date('2026-01-05T06:00:00.000Z');
  q1 = await rescoreToEnd(t, { networkVersionId: 1, quarterLabel: '2026-Q1' });
  t.clock.now = new Date('2026-04-06T06:00:00.000Z');
  const version = await importDemoQ2(t);
  q2 = await rescoreToEnd(t, { networkVersionId: version, quarterLabel: '2026-Q2' });
}, 180_000);

afterAll(async () => {
  await t.close();
});

describe('the comparison after two quarterly re-scorings', () => {
  it('compares this quarter against the last by default, with exactly the demo\'s changes',
    async () => {
      expect([q1.status, q2.status]).toEqual(['succeeded', 'succeeded']);
      const response = await getAs(t, '/api/comparison', 'risk_manager');
      expect(response.status).toBe(200);
      const body = response.body as RunComparisonDto;
      expect(body.fromRun).toMatchObject({ id: q1.analysisRunId, quarterLabel: '2026-Q1' });
      expect(body.toRun).toMatchObject({ id: q2.analysisRunId, quarterLabel: '2026-Q2' });
      expect(codes(body.newSinglePoints)).toEqual(['S-1-096']);
      expect(codes(body.goneSinglePoints)).toEqual(['S-2-SHARED-B']);
      expect(codes(body.suppliersAdded)).toEqual(['S-1-096']);
      expect(codes(body.suppliersRemoved)).toEqual(['S-2-003']);
    });

  it('has one trend item per quarter and the entries\' scores of both', async () => {
    const trends = (await getAs(t, '/api/comparison/trends')).body as RescoringTrendsDto;
    expect(trends.items.map((item) => [item.quarterLabel, item.rescoringId,
      item.analysisRunId, item.singlePointsOfFailure])).toEqual([
      ['2026-Q1', q1.id, q1.analysisRunId, 81], ['2026-Q2', q2.id, q2.analysisRunId, 81]]);
    const entry = t.database.sqlite.prepare("SELECT id FROM register_entries WHERE " +
      "supplier_code = 'S-2-SHARED-B' ORDER BY id LIMIT 1").get() as { id: number };
    const scores = (await getAs(t, `/api/comparison/entries/${entry.id}/scores`)).body as
      EntryScoreDto[];
    expect(scores.map((score) => score.quarterLabel)).toEqual(['2026-Q1', '2026-Q2']);
    const counted = t.database.sqlite.prepare("SELECT count(*) AS n FROM register_entry_scores " +
      "WHERE rescoring_run_id = ? AND rating_band IN ('high', 'critical')").get(q2.id) as
      { n: number };
    expect(trends.items[1]!.highEntries + trends.items[1]!.criticalEntries).toBe(counted.n);
  });
});
