/**
 * Reads a run's stored results: the sort and filter keys of every row (held in memory by
 * run-ranking-index.ts), rows by id, a supplier's row and history. SQL on the connection with
 * prepared statements kept per query, because the ranking is the hottest read of the product
 * (its latency is measured in tests/bench/measure-api.ts).
 */
import type Database from 'better-sqlite3';
import type { RatingBand, RunSupplierDto } from '@keelson/contracts';
import { connectionOf, type KeelsonDatabase } from '@keelson/db';
import type { ProductImpact } from '@keelson/supply-graph';
import type { RankingKey } from './run-ranking-index';

/** A stored result row as read back. */
export interface StoredRunSupplier extends RunSupplierDto {
  products: ProductImpact[];
}

/** One row of a supplier's history over succeeded runs. */
export interface HistoryRow {
  runId: number;
  label: string;
  finishedAt: string;
  revenueImpact: number;
  rating: number;
  likelihood: number;
  impactBand: number;
  nexusIndex: number;
}

// Every column but `products` (a list does not show time to survive per product).
const LIST_COLUMNS = ['rank', 'code', 'name', 'country', 'region', 'tier', 'products_lost',
  'plants', 'revenue_exposed_per_week', 'revenue_impact', 'time_to_recover',
  'single_point_of_failure', 'betweenness', 'degree', 'closeness', 'eigenvector', 'pagerank',
  'nexus_index', 'likelihood', 'likelihood_factors', 'impact_band', 'rating', 'rating_band']
  .map((name) => `s.${name}`).join(', ');

interface RawRow {
  rank: number; code: string; name: string; country: string; region: string;
  tier: number | null; products_lost: string; plants: string;
  revenue_exposed_per_week: number; revenue_impact: number; time_to_recover: number;
  single_point_of_failure: number; betweenness: number; degree: number; closeness: number;
  eigenvector: number; pagerank: number; nexus_index: number; products: string;
  likelihood: number; likelihood_factors: string; impact_band: number; rating: number;
  rating_band: RatingBand;
}

/** Read access to run results. */
export class RunResultsRepository {
  private readonly connection: Database.Database;
  private readonly statements = new Map<string, Database.Statement>();

  constructor(db: KeelsonDatabase) {
    this.connection = connectionOf(db);
  }

  /** The sort and filter keys of every row of a run, with the plants each touches. */
  rankingKeys(runId: number): RankingKey[] {
    const plants = new Map<string, string[]>();
    const plantRows = this.prepare('SELECT code, plant_code FROM run_supplier_plants ' +
      'WHERE run_id = ? ORDER BY code, plant_code').raw().all(runId) as [string, string][];
    for (const [code, plant] of plantRows) {
      const list = plants.get(code);
      if (list) list.push(plant);
      else plants.set(code, [plant]);
    }
    const rows = this.prepare('SELECT rowid AS rowId, rank, code, name, country, region, tier, ' +
      'products_lost_count AS productsLost, revenue_exposed_per_week AS revenueExposedPerWeek, ' +
      'revenue_impact AS revenueImpact, time_to_recover AS timeToRecover, ' +
      'single_point_of_failure AS singlePointOfFailure, betweenness, degree, closeness, ' +
      'eigenvector, pagerank, nexus_index AS nexusIndex, likelihood, impact_band AS impactBand, ' +
      'rating, rating_band AS ratingBand FROM run_suppliers WHERE run_id = ?').all(runId) as
      (Omit<RankingKey, 'plants' | 'singlePointOfFailure'> & { singlePointOfFailure: number })[];
    return rows.map((row) => ({ ...row, singlePointOfFailure: row.singlePointOfFailure === 1,
      plants: plants.get(row.code) ?? [] }));
  }

  /** Rows by rowid, in the order of `ids`, without the per-product column. */
  rowsByIds(ids: readonly number[]): RunSupplierDto[] {
    if (ids.length === 0) return [];
    const found = this.prepare(`SELECT s.rowid AS row_id, ${LIST_COLUMNS} FROM run_suppliers s ` +
      'WHERE s.rowid IN (SELECT value FROM json_each(?))').all(JSON.stringify(ids)) as
      (Omit<RawRow, 'products'> & { row_id: number })[];
    const byId = new Map(found.map((row) => [row.row_id, row]));
    return ids.map((id) => toDto(byId.get(id)!));
  }

  /** Rows by rowid with their products (the export), in the order of `ids`. */
  fullRowsByIds(ids: readonly number[]): StoredRunSupplier[] {
    if (ids.length === 0) return [];
    const found = this.prepare('SELECT rowid AS row_id, * FROM run_suppliers ' +
      'WHERE rowid IN (SELECT value FROM json_each(?))').all(JSON.stringify(ids)) as
      (RawRow & { row_id: number })[];
    const byId = new Map(found.map((row) => [row.row_id, row]));
    return ids.map((id) => toStored(byId.get(id)!));
  }

  /** One supplier's row in a run. */
  find(runId: number, code: string): StoredRunSupplier | undefined {
    const row = this.prepare('SELECT * FROM run_suppliers s WHERE run_id = ? AND code = ?')
      .get(runId, code) as RawRow | undefined;
    return row ? toStored(row) : undefined;
  }

  /** The supplier's scores in every succeeded run, oldest first. */
  history(code: string): HistoryRow[] {
    return this.prepare('SELECT r.id AS runId, r.label AS label, r.finished_at AS finishedAt, ' +
      's.revenue_impact AS revenueImpact, s.rating AS rating, s.likelihood AS likelihood, ' +
      's.impact_band AS impactBand, s.nexus_index AS nexusIndex FROM run_suppliers s ' +
      "JOIN analysis_runs r ON r.id = s.run_id WHERE s.code = ? AND r.status = 'succeeded' " +
      'ORDER BY r.finished_at ASC, r.id ASC').all(code) as HistoryRow[];
  }

  /** The first register entry of a supplier, if any. */
  registerEntryId(code: string): number | null {
    const row = this.prepare('SELECT id FROM register_entries WHERE supplier_code = ? ' +
      'ORDER BY id LIMIT 1').get(code) as { id: number } | undefined;
    return row?.id ?? null;
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

function toStored(row: RawRow): StoredRunSupplier {
  return { ...toDto(row), products: JSON.parse(row.products) as ProductImpact[] };
}

function toDto(row: Omit<RawRow, 'products'>): RunSupplierDto {
  return {
    rank: row.rank,
    code: row.code,
    name: row.name,
    country: row.country,
    region: row.region,
    tier: row.tier,
    productsLost: JSON.parse(row.products_lost) as string[],
    revenueExposedPerWeek: row.revenue_exposed_per_week,
    revenueImpact: row.revenue_impact,
    timeToRecover: row.time_to_recover,
    singlePointOfFailure: row.single_point_of_failure === 1,
    betweenness: row.betweenness,
    degree: row.degree,
    closeness: row.closeness,
    eigenvector: row.eigenvector,
    pagerank: row.pagerank,
    nexusIndex: row.nexus_index,
    plants: JSON.parse(row.plants) as string[],
    likelihood: row.likelihood,
    likelihoodFactors: JSON.parse(row.likelihood_factors) as Record<string, number>,
    impactBand: row.impact_band,
    rating: row.rating,
    ratingBand: row.rating_band,
  };
}
