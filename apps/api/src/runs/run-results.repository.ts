/**
 * Reads a run's stored results: the ranking page with its filters and sort, the heat-map
 * counts, the Pareto head, a supplier's row and history. SQL on the connection with cached
 * prepared statements per query shape, because the ranking is the hottest read of the product
 * (its latency is measured in tests/bench/measure-api.ts).
 */
import type Database from 'better-sqlite3';
import type { ListRunSuppliersQuery, RatingBand, RunSupplierDto } from '@keelson/contracts';
import { connectionOf, type KeelsonDatabase } from '@keelson/db';
import type { ProductImpact } from '@keelson/supply-graph';

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

// Sort fields to columns: the names are constants, never user input.
const SORT_COLUMNS: Record<ListRunSuppliersQuery['sort'], string> = {
  rank: 'rank', code: 'code', name: 'name', tier: 'tier', country: 'country', region: 'region',
  productsLost: 'products_lost_count', revenueExposedPerWeek: 'revenue_exposed_per_week',
  revenueImpact: 'revenue_impact', timeToRecover: 'time_to_recover',
  betweenness: 'betweenness', degree: 'degree', closeness: 'closeness',
  eigenvector: 'eigenvector', pagerank: 'pagerank', nexusIndex: 'nexus_index',
  likelihood: 'likelihood', impactBand: 'impact_band', rating: 'rating',
};

const PLANT_CONDITION = (count: number) =>
  `EXISTS (SELECT 1 FROM run_supplier_plants p WHERE p.run_id = s.run_id AND p.code = s.code ` +
  `AND p.plant_code IN (${Array.from({ length: count }, () => '?').join(', ')}))`;

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

/** Filters of the ranking, with the plant scope already resolved. */
export type RunSupplierFilter = Omit<ListRunSuppliersQuery, 'limit' | 'offset' | 'sort' |
  'order' | 'plant'> & { plants: readonly string[] | null };

/** Read access to run results. */
export class RunResultsRepository {
  private readonly connection: Database.Database;
  private readonly statements = new Map<string, Database.Statement>();

  constructor(db: KeelsonDatabase) {
    this.connection = connectionOf(db);
  }

  /**
   * A page of the ranking and the number of rows matching the filters. Two steps: the sort
   * runs over row ids and sort keys only, then the page's rows are read by id, so a sort over
   * ten thousand rows never carries their JSON columns through the sorter.
   */
  page(runId: number, filter: RunSupplierFilter, page: Pick<ListRunSuppliersQuery,
    'limit' | 'offset' | 'sort' | 'order'>): { rows: RunSupplierDto[]; total: number } {
    const { where, params } = this.where(runId, filter);
    const direction = page.order === 'desc' ? 'DESC' : 'ASC';
    // NULL tiers sort last either way; rank breaks ties so pages never overlap.
    const column = SORT_COLUMNS[page.sort];
    const order = `s.${column} IS NULL, s.${column} ${direction}, s.rank ASC`;
    const ids = this.prepare(`SELECT s.rowid FROM run_suppliers s WHERE ${where} ` +
      `ORDER BY ${order} LIMIT ? OFFSET ?`).pluck().all(...params, page.limit, page.offset) as
      number[];
    const total = (this.prepare(`SELECT count(*) AS total FROM run_suppliers s WHERE ${where}`)
      .get(...params) as { total: number }).total;
    if (ids.length === 0) return { rows: [], total };
    const found = this.prepare(`SELECT s.rowid AS row_id, ${LIST_COLUMNS} FROM run_suppliers s ` +
      `WHERE s.rowid IN (SELECT value FROM json_each(?))`).all(JSON.stringify(ids)) as
      (Omit<RawRow, 'products'> & { row_id: number })[];
    const byId = new Map(found.map((row) => [row.row_id, row]));
    const rows = ids.map((id) => toDto(byId.get(id)!));
    return { rows, total };
  }

  /** Every row matching the filters, in rank order (the export). */
  all(runId: number, filter: RunSupplierFilter): StoredRunSupplier[] {
    const { where, params } = this.where(runId, filter);
    return (this.prepare(`SELECT * FROM run_suppliers s WHERE ${where} ORDER BY rank`)
      .all(...params) as RawRow[]).map(toStored);
  }

  /** One supplier's row in a run. */
  find(runId: number, code: string): StoredRunSupplier | undefined {
    const row = this.prepare('SELECT * FROM run_suppliers s WHERE run_id = ? AND code = ?')
      .get(runId, code) as RawRow | undefined;
    return row ? toStored(row) : undefined;
  }

  /** Counts per (likelihood, impact band) within the plant scope. */
  heatMap(runId: number, plants: readonly string[] | null):
    { likelihood: number; impactBand: number; count: number }[] {
    const { where, params } = this.where(runId, { plants });
    return this.prepare('SELECT likelihood, impact_band AS impactBand, count(*) AS count ' +
      `FROM run_suppliers s WHERE ${where} GROUP BY likelihood, impact_band`)
      .all(...params) as { likelihood: number; impactBand: number; count: number }[];
  }

  /** The first `limit` rows by revenue impact, and the sum over every row in scope. */
  pareto(runId: number, plants: readonly string[] | null, limit: number):
    { rows: { code: string; name: string; revenueImpact: number }[]; total: number } {
    const { where, params } = this.where(runId, { plants });
    const rows = this.prepare('SELECT code, name, revenue_impact AS revenueImpact FROM ' +
      `run_suppliers s WHERE ${where} ORDER BY revenue_impact DESC, rank ASC LIMIT ?`)
      .all(...params, limit) as { code: string; name: string; revenueImpact: number }[];
    const total = (this.prepare('SELECT coalesce(sum(revenue_impact), 0) AS total FROM ' +
      `run_suppliers s WHERE ${where}`).get(...params) as { total: number }).total;
    return { rows, total };
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

  private where(runId: number, filter: Partial<RunSupplierFilter>):
    { where: string; params: unknown[] } {
    const parts = ['s.run_id = ?'];
    const params: unknown[] = [runId];
    const add = (sql: string, ...values: unknown[]) => {
      parts.push(sql);
      params.push(...values);
    };
    if (filter.q) {
      const like = `%${filter.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      add("(s.code LIKE ? ESCAPE '\\' OR s.name LIKE ? ESCAPE '\\')", like, like);
    }
    if (filter.tier !== undefined) add('s.tier = ?', filter.tier);
    if (filter.country) add('s.country = ? COLLATE NOCASE', filter.country);
    if (filter.region) add('s.region = ? COLLATE NOCASE', filter.region);
    if (filter.ratingBand) add('s.rating_band = ?', filter.ratingBand);
    if (filter.likelihood !== undefined) add('s.likelihood = ?', filter.likelihood);
    if (filter.impactBand !== undefined) add('s.impact_band = ?', filter.impactBand);
    if (filter.singlePointsOnly === 'true') add('s.single_point_of_failure = 1');
    if (filter.plants) {
      if (filter.plants.length === 0) add('0');
      else add(PLANT_CONDITION(filter.plants.length), ...filter.plants);
    }
    return { where: parts.join(' AND '), params };
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
