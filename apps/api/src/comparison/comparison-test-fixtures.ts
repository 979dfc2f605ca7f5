/**
 * Fixtures of the comparison specs: the next quarter's demo workbook imported through the API,
 * and re-scoring rows with their entry scores written straight into the database (the
 * re-scoring feature writes them in real use; these specs only read them).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { RatingBand } from '@keelson/contracts';
import { upload } from '../imports/import-fixtures';
import { REPOSITORY_ROOT } from '../config/app-config';
import type { TestApp } from '../testing/test-app';

/** The next quarter of the demo (tools/demo-network-q2.ts). */
export const DEMO_Q2_WORKBOOK_PATH = resolve(REPOSITORY_ROOT, 'data/demo/keelson-demo-q2.xlsx');

/** Imports the next quarter's demo workbook as the demo buyer; returns the new version id. */
export async function importDemoQ2(t: TestApp): Promise<number> {
  const bytes = new Uint8Array(readFileSync(DEMO_Q2_WORKBOOK_PATH));
  const response = await upload(t, bytes, 'keelson-demo-q2.xlsx', { query: 'commit=true' });
  if (response.status !== 201) {
    throw new Error(`the Q2 import answered ${response.status}: ${JSON.stringify(response.body)}`);
  }
  return (response.body as { networkVersionId: number }).networkVersionId;
}

/** A re-scoring row to insert. */
export interface RescoringFixture {
  quarterLabel: string;
  analysisRunId: number;
  status?: 'succeeded' | 'failed' | 'running';
  finishedAt: string;
  /** Entry id to its rating band (stored with a rating inside the band). */
  scores?: Record<number, RatingBand>;
}

// Impact band x likelihood giving a rating inside each band (default settings).
const SCORE_OF_BAND: Record<RatingBand, { impactBand: number; likelihood: number }> = {
  low: { impactBand: 1, likelihood: 2 },
  medium: { impactBand: 2, likelihood: 4 },
  high: { impactBand: 3, likelihood: 4 },
  critical: { impactBand: 5, likelihood: 4 },
};

/** Inserts a re-scoring and its entry scores; returns the re-scoring's id. */
export function insertRescoring(t: TestApp, fixture: RescoringFixture): number {
  const sqlite = t.database.sqlite;
  const version = sqlite.prepare('SELECT network_version_id AS id FROM analysis_runs WHERE id = ?')
    .get(fixture.analysisRunId) as { id: number };
  const status = fixture.status ?? 'succeeded';
  const inserted = sqlite.prepare('INSERT INTO rescoring_runs (quarter_label, ' +
    'network_version_id, analysis_run_id, status, trigger, is_forced, attempts, created_at, ' +
    "started_at, finished_at) VALUES (?, ?, ?, ?, 'manual', ?, 1, ?, ?, ?)")
    .run(fixture.quarterLabel, version.id, fixture.analysisRunId, status,
      status === 'succeeded' ? 0 : 1, fixture.finishedAt, fixture.finishedAt, fixture.finishedAt);
  const rescoringId = Number(inserted.lastInsertRowid);
  const score = sqlite.prepare('INSERT INTO register_entry_scores (entry_id, rescoring_run_id, ' +
    'likelihood, impact_band, rating, rating_band, previous_rating, revenue_impact, flag, ' +
    'created_at) VALUES (?, ?, ?, ?, ?, ?, NULL, ?, NULL, ?)');
  for (const [entryId, band] of Object.entries(fixture.scores ?? {})) {
    const { impactBand, likelihood } = SCORE_OF_BAND[band];
    const rating = impactBand * likelihood;
    score.run(Number(entryId), rescoringId, likelihood, impactBand, rating, band, rating * 1000,
      fixture.finishedAt);
  }
  return rescoringId;
}

/** Marks analysis runs as the re-scoring's (kind `quarterly`), as the re-scoring starts them. */
export function markQuarterly(t: TestApp, ...runIds: number[]): void {
  const statement = t.database.sqlite.prepare("UPDATE analysis_runs SET kind = 'quarterly' " +
    'WHERE id = ?');
  for (const id of runIds) statement.run(id);
}
