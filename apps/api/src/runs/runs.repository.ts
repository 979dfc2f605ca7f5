/**
 * Drizzle access to `analysis_runs` and the writes of a run's results (`run_suppliers`,
 * `run_supplier_plants`) with prepared statements on the transaction's connection.
 */
import { and, count, desc, eq, inArray, type SQL } from 'drizzle-orm';
import {
  analysisRuns,
  connectionOf,
  countries,
  insertRows,
  networkVersions,
  users,
  type AnalysisRunRow,
  type KeelsonDatabase,
} from '@keelson/db';
import type { RunStatus } from '@keelson/contracts';
import type { RunRow } from './run-rows';
import { countryKey } from './run-rows';

/** A run row with its creator's name. */
export interface RunRecord extends AnalysisRunRow {
  createdByName: string | null;
}

/** Changes to a run's state. */
export type RunChanges = Partial<
  Pick<AnalysisRunRow, 'status' | 'progress' | 'stage' | 'error' | 'totals' | 'timings' |
    'methods' | 'scoringSettings' | 'startedAt' | 'finishedAt'>
>;

const RESULT_COLUMNS = [
  'run_id', 'code', 'name', 'country', 'region', 'tier', 'rank', 'products_lost',
  'products_lost_count', 'plants', 'revenue_exposed_per_week', 'revenue_impact',
  'time_to_recover', 'single_point_of_failure', 'betweenness', 'degree', 'closeness',
  'eigenvector', 'pagerank', 'nexus_index', 'products', 'likelihood', 'likelihood_factors',
  'impact_band', 'rating', 'rating_band',
] as const;

/** Reads and writes analysis runs. */
export class RunsRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Inserts a queued run and returns its id. */
  insert(values: { networkVersionId: number; label: string; kind: AnalysisRunRow['kind'];
    createdBy: number | null; createdAt: string }): number {
    return this.db.insert(analysisRuns)
      .values({ ...values, status: 'queued', progress: 0 })
      .returning({ id: analysisRuns.id }).get().id;
  }

  /** One run with its creator's name (read through `db`, a transaction if given). */
  find(id: number, db: KeelsonDatabase = this.db): RunRecord | undefined {
    return this.select(db).where(eq(analysisRuns.id, id)).get();
  }

  /** A page of runs, newest first, and how many there are. */
  list(page: { limit: number; offset: number; networkVersionId?: number }):
    { rows: RunRecord[]; total: number } {
    const where: SQL | undefined = page.networkVersionId === undefined
      ? undefined
      : eq(analysisRuns.networkVersionId, page.networkVersionId);
    const rows = this.select().where(where)
      .orderBy(desc(analysisRuns.createdAt), desc(analysisRuns.id))
      .limit(page.limit).offset(page.offset).all();
    const total = this.db.select({ value: count() }).from(analysisRuns).where(where).get()
      ?.value ?? 0;
    return { rows, total };
  }

  /** Applies `changes` to run `id`; with `onlyIf`, only while the run has one of those states. */
  update(id: number, changes: RunChanges, onlyIf?: readonly RunStatus[],
    db: KeelsonDatabase = this.db): boolean {
    const condition = onlyIf
      ? and(eq(analysisRuns.id, id), inArray(analysisRuns.status, [...onlyIf]))
      : eq(analysisRuns.id, id);
    return db.update(analysisRuns).set(changes).where(condition).run().changes > 0;
  }

  /** Marks every run still `queued` or `running` as failed (a restart lost them). */
  failUnfinished(message: string, finishedAt: string): number {
    return this.db.update(analysisRuns)
      .set({ status: 'failed', error: message, finishedAt, stage: null })
      .where(inArray(analysisRuns.status, ['queued', 'running'])).run().changes;
  }

  /** Whether network version `id` exists. */
  versionExists(id: number): boolean {
    return this.db.select({ id: networkVersions.id }).from(networkVersions)
      .where(eq(networkVersions.id, id)).get() !== undefined;
  }

  /** Country hazards by upper-case code. */
  hazards(): Map<string, number> {
    const rows = this.db.select({ code: countries.code, hazard: countries.hazard })
      .from(countries).all();
    return new Map(rows.map((row) => [countryKey(row.code), row.hazard]));
  }

  /**
   * Inserts every result row and its plants with prepared statements on `tx`'s connection.
   * Call it inside the transaction that marks the run succeeded.
   */
  insertResults(tx: KeelsonDatabase, runId: number, rows: readonly RunRow[]): void {
    const connection = connectionOf(tx);
    insertRows(connection, 'run_suppliers', RESULT_COLUMNS, rows, (row) => [
      runId, row.code, row.name, row.country, row.region, row.tier, row.rank,
      JSON.stringify(row.productsLost), row.productsLost.length, JSON.stringify(row.plants),
      row.revenueExposedPerWeek, row.revenueImpact, row.timeToRecover,
      row.singlePointOfFailure ? 1 : 0, row.betweenness, row.degree, row.closeness,
      row.eigenvector, row.pagerank, row.nexusIndex, JSON.stringify(row.products),
      row.likelihood, JSON.stringify(row.likelihoodFactors), row.impactBand, row.rating,
      row.ratingBand,
    ]);
    const plants = rows.flatMap((row) => row.plants.map((plantCode) => [row.code, plantCode]));
    insertRows(connection, 'run_supplier_plants', ['run_id', 'code', 'plant_code'], plants,
      ([code, plantCode]) => [runId, code, plantCode]);
  }

  private select(db: KeelsonDatabase = this.db) {
    return db
      .select({
        id: analysisRuns.id,
        networkVersionId: analysisRuns.networkVersionId,
        label: analysisRuns.label,
        kind: analysisRuns.kind,
        status: analysisRuns.status,
        progress: analysisRuns.progress,
        stage: analysisRuns.stage,
        error: analysisRuns.error,
        totals: analysisRuns.totals,
        timings: analysisRuns.timings,
        methods: analysisRuns.methods,
        scoringSettings: analysisRuns.scoringSettings,
        createdBy: analysisRuns.createdBy,
        createdAt: analysisRuns.createdAt,
        startedAt: analysisRuns.startedAt,
        finishedAt: analysisRuns.finishedAt,
        createdByName: users.name,
      })
      .from(analysisRuns)
      .leftJoin(users, eq(users.id, analysisRuns.createdBy))
      .$dynamic();
  }
}
