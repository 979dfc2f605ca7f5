/**
 * Reads what the comparison, the quarterly trends and an entry's score history need: succeeded
 * analysis runs with the quarter label of their re-scoring, a run's supplier rows with the plants
 * each touches, the totals of a re-scoring's run and the scores of register entries. Read only;
 * prepared statements on the connection, kept per query.
 */
import type Database from 'better-sqlite3';
import type { RatingBand, RegisterFlag } from '@keelson/contracts';
import { connectionOf, type KeelsonDatabase } from '@keelson/db';

/** A run as the comparison names it. */
export interface ComparedRunRow {
  id: number;
  label: string;
  networkVersionId: number;
  kind: 'manual' | 'quarterly';
  status: string;
  finishedAt: string | null;
  /** The quarter of the re-scoring whose analysis run this is (the latest such), if any. */
  quarterLabel: string | null;
}

/** One supplier's row of a run, with the plants its lost products belong to. */
export interface ComparedSupplierRow {
  code: string;
  name: string;
  tier: number | null;
  rating: number;
  ratingBand: RatingBand;
  revenueImpact: number;
  singlePointOfFailure: boolean;
  plants: string[];
}

/** A succeeded re-scoring with its analysis run, for the trends. */
export interface TrendRescoringRow {
  rescoringId: number;
  quarterLabel: string;
  analysisRunId: number;
}

/** One stored score of an entry with its re-scoring's quarter. */
export interface EntryScoreRow {
  quarterLabel: string;
  rescoringId: number;
  rating: number;
  ratingBand: RatingBand;
  previousRating: number | null;
  revenueImpact: number | null;
  flag: RegisterFlag | null;
  createdAt: string;
}

const RUN_COLUMNS = 'r.id AS id, r.label AS label, r.network_version_id AS networkVersionId, ' +
  'r.kind AS kind, r.status AS status, r.finished_at AS finishedAt, (SELECT q.quarter_label ' +
  'FROM rescoring_runs q WHERE q.analysis_run_id = r.id ORDER BY q.id DESC LIMIT 1) ' +
  'AS quarterLabel';

// Newest first: the order "latest" and "the one before" are read in.
const NEWEST_FIRST = 'ORDER BY r.finished_at DESC, r.id DESC';

/** Read access for the comparison feature. */
export class ComparisonRepository {
  private readonly connection: Database.Database;
  private readonly statements = new Map<string, Database.Statement>();

  constructor(db: KeelsonDatabase) {
    this.connection = connectionOf(db);
  }

  /** Any run by id (any status), or undefined. */
  run(id: number): ComparedRunRow | undefined {
    return this.prepare(`SELECT ${RUN_COLUMNS} FROM analysis_runs r WHERE r.id = ?`)
      .get(id) as ComparedRunRow | undefined;
  }

  /** The newest succeeded runs, of one kind or of any (`null`), newest first. */
  latestSucceeded(kind: 'quarterly' | null, limit: number): ComparedRunRow[] {
    return this.prepare(`SELECT ${RUN_COLUMNS} FROM analysis_runs r WHERE r.status = ` +
      `'succeeded' AND (? IS NULL OR r.kind = ?) ${NEWEST_FIRST} LIMIT ?`)
      .all(kind, kind, limit) as ComparedRunRow[];
  }

  /**
   * The nearest succeeded run before (`'before'`) or after (`'after'`) `run` in the order of
   * finishing (then id), of one kind or of any (`null`).
   */
  neighbour(run: ComparedRunRow, direction: 'before' | 'after', kind: 'quarterly' | null):
    ComparedRunRow | undefined {
    const finished = run.finishedAt ?? '';
    const condition = direction === 'before'
      ? '(r.finished_at < ? OR (r.finished_at = ? AND r.id < ?))'
      : '(r.finished_at > ? OR (r.finished_at = ? AND r.id > ?))';
    const order = direction === 'before' ? NEWEST_FIRST : 'ORDER BY r.finished_at, r.id';
    return this.prepare(`SELECT ${RUN_COLUMNS} FROM analysis_runs r WHERE r.status = ` +
      `'succeeded' AND (? IS NULL OR r.kind = ?) AND ${condition} ${order} LIMIT 1`)
      .get(kind, kind, finished, finished, run.id) as ComparedRunRow | undefined;
  }

  /** Every supplier row of a run with its plants, by code. */
  supplierRows(runId: number): Map<string, ComparedSupplierRow> {
    const plants = new Map<string, string[]>();
    const plantRows = this.prepare('SELECT code, plant_code FROM run_supplier_plants ' +
      'WHERE run_id = ? ORDER BY code, plant_code').raw().all(runId) as [string, string][];
    for (const [code, plant] of plantRows) plants.set(code, [...(plants.get(code) ?? []), plant]);
    const rows = this.prepare('SELECT code, name, tier, rating, rating_band AS ratingBand, ' +
      'revenue_impact AS revenueImpact, single_point_of_failure AS spof FROM run_suppliers ' +
      'WHERE run_id = ? ORDER BY code').all(runId) as
      (Omit<ComparedSupplierRow, 'plants' | 'singlePointOfFailure'> & { spof: number })[];
    return new Map(rows.map(({ spof, ...row }) => [row.code, { ...row,
      singlePointOfFailure: spof === 1, plants: plants.get(row.code) ?? [] }]));
  }

  /** Succeeded re-scorings whose analysis run still exists, oldest first. */
  succeededRescorings(): TrendRescoringRow[] {
    return this.prepare('SELECT q.id AS rescoringId, q.quarter_label AS quarterLabel, ' +
      'q.analysis_run_id AS analysisRunId FROM rescoring_runs q JOIN analysis_runs r ON ' +
      "r.id = q.analysis_run_id WHERE q.status = 'succeeded' ORDER BY q.finished_at, q.id")
      .all() as TrendRescoringRow[];
  }

  /**
   * A run's total revenue impact and count of single points of failure. With `plants`, only
   * the lost products of those plants count towards the revenue (weekly revenue x lost weeks,
   * exactly how the engine sums a supplier's revenue impact) and only the single points whose
   * lost products reach one of them.
   */
  runTotals(runId: number, plants: readonly string[] | null):
    { totalRevenueImpact: number; singlePointsOfFailure: number } {
    if (plants === null) {
      return this.prepare('SELECT coalesce(sum(revenue_impact), 0) AS totalRevenueImpact, ' +
        'coalesce(sum(single_point_of_failure), 0) AS singlePointsOfFailure FROM ' +
        'run_suppliers WHERE run_id = ?').get(runId) as
        { totalRevenueImpact: number; singlePointsOfFailure: number };
    }
    const scope = JSON.stringify(plants);
    const revenue = this.prepare('SELECT coalesce(sum(json_extract(p.value, \'$.weeklyRevenue\')' +
      ' * json_extract(p.value, \'$.lostWeeks\')), 0) AS total FROM run_suppliers s, ' +
      'json_each(s.products) p WHERE s.run_id = ? AND json_extract(p.value, \'$.plantCode\') ' +
      'IN (SELECT value FROM json_each(?))').get(runId, scope) as { total: number };
    const spofs = this.prepare('SELECT count(*) AS count FROM run_suppliers s WHERE ' +
      's.run_id = ? AND s.single_point_of_failure = 1 AND EXISTS (SELECT 1 FROM ' +
      'run_supplier_plants p WHERE p.run_id = s.run_id AND p.code = s.code AND p.plant_code ' +
      'IN (SELECT value FROM json_each(?)))').get(runId, scope) as { count: number };
    return { totalRevenueImpact: revenue.total, singlePointsOfFailure: spofs.count };
  }

  /** Entries of a re-scoring rated high and critical (with `plants`: entries of those plants). */
  bandCounts(rescoringId: number, plants: readonly string[] | null):
    { high: number; critical: number } {
    return this.prepare("SELECT coalesce(sum(s.rating_band = 'high'), 0) AS high, " +
      "coalesce(sum(s.rating_band = 'critical'), 0) AS critical FROM register_entry_scores s " +
      'WHERE s.rescoring_run_id = ? AND (? IS NULL OR EXISTS (SELECT 1 FROM ' +
      'register_entry_plants p WHERE p.entry_id = s.entry_id AND p.plant_code IN ' +
      '(SELECT value FROM json_each(?))))')
      .get(rescoringId, plants === null ? null : 1, JSON.stringify(plants ?? [])) as
      { high: number; critical: number };
  }

  /** Whether an entry exists, and its plants. */
  entryPlants(entryId: number): string[] | undefined {
    const entry = this.prepare('SELECT id FROM register_entries WHERE id = ?').get(entryId);
    if (!entry) return undefined;
    return (this.prepare('SELECT plant_code FROM register_entry_plants WHERE entry_id = ? ' +
      'ORDER BY plant_code').raw().all(entryId) as [string][]).map(([plant]) => plant);
  }

  /** An entry's scores at succeeded re-scorings, oldest first. */
  entryScores(entryId: number): EntryScoreRow[] {
    return this.prepare('SELECT q.quarter_label AS quarterLabel, q.id AS rescoringId, ' +
      's.rating AS rating, s.rating_band AS ratingBand, s.previous_rating AS previousRating, ' +
      's.revenue_impact AS revenueImpact, s.flag AS flag, s.created_at AS createdAt FROM ' +
      'register_entry_scores s JOIN rescoring_runs q ON q.id = s.rescoring_run_id WHERE ' +
      "s.entry_id = ? AND q.status = 'succeeded' ORDER BY q.finished_at, q.id")
      .all(entryId) as EntryScoreRow[];
  }

  private prepare(sql: string): Database.Statement {
    let statement = this.statements.get(sql);
    if (!statement) {
      statement = this.connection.prepare(sql);
      this.statements.set(sql, statement);
    }
    return statement;
  }
}
