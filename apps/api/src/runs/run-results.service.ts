/**
 * A succeeded run's results as people read them: the ranking (sorted, filtered, paged), a
 * supplier's risk page (failure paths, history, register entry), the heat map and the Pareto
 * head. Plant managers see only rows whose lost products include one of their plants.
 */
import {
  RUN_NOT_READY,
  type HeatMapDto,
  type ListRunSuppliersQuery,
  type ParetoDto,
  type RunSupplierDetailDto,
  type RunSupplierDto,
} from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { failurePaths, type SupplyGraph } from '@keelson/supply-graph';
import { AppError, conflict, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { checkPlantFilter, effectivePlants, plantScopeOf } from '../network/plant-scope';
import type { NetworkGraphCache } from '../network/network-graph-cache';
import { RunRankingCache, type RankingFilter } from './run-ranking-index';
import { RunResultsRepository, type StoredRunSupplier } from './run-results.repository';
import { toProductPath } from './scenario-paths';
import { RunsRepository, type RunRecord } from './runs.repository';

/** The export's query: the ranking's sort and filters, without paging. */
export type ExportRunSuppliersQuery = Omit<ListRunSuppliersQuery, 'limit' | 'offset'>;

/** How many suppliers the Pareto chart shows. */
export const PARETO_SIZE = 200;

/** Reads run results within the user's plant scope. */
export class RunResultsService {
  private readonly results: RunResultsRepository;
  private readonly runs: RunsRepository;
  private readonly rankings: RunRankingCache;

  constructor(db: KeelsonDatabase, private readonly graphs: NetworkGraphCache) {
    this.results = new RunResultsRepository(db);
    this.runs = new RunsRepository(db);
    this.rankings = new RunRankingCache((runId) => this.results.rankingKeys(runId));
  }

  /** A page of the ranking; 403 `plant_forbidden` for another plant's filter. */
  suppliers(user: SessionUser, runId: number, query: ListRunSuppliersQuery):
    { items: RunSupplierDto[]; total: number } {
    this.readyRun(runId);
    const { sort, order, limit, offset } = query;
    const matches = this.rankings.get(runId).select(this.filterOf(user, query), sort, order);
    const page = matches.slice(offset, offset + limit).map((key) => key.rowId);
    return { items: this.results.rowsByIds(page), total: matches.length };
  }

  /**
   * Every row in scope (the export), in rank order or as `query` sorts and filters them like
   * the ranking screen; 403 `plant_forbidden` for another plant's filter.
   */
  everySupplier(user: SessionUser, runId: number, query?: ExportRunSuppliersQuery):
    { run: RunRecord; rows: StoredRunSupplier[] } {
    const run = this.readyRun(runId);
    const keys = query === undefined
      ? this.rankings.get(runId).select({ plants: plantScopeOf(user) })
      : this.rankings.get(runId).select(this.filterOf(user, { ...query, limit: 1, offset: 0 }),
        query.sort, query.order);
    return { run, rows: this.results.fullRowsByIds(keys.map((key) => key.rowId)) };
  }

  /** One supplier's risk page; 404 when it is not in the run or not in the user's scope. */
  detail(user: SessionUser, runId: number, code: string): RunSupplierDetailDto {
    const run = this.readyRun(runId);
    const row = this.results.find(runId, code);
    const scope = plantScopeOf(user);
    if (!row || (scope !== null && !row.plants.some((plant) => scope.includes(plant)))) {
      throw notFound(!row || scope === null
        ? `Supplier ${code} is not in analysis run ${runId}.`
        : `Supplier ${code} does not touch your plants in analysis run ${runId}.`);
    }
    const { graph } = this.graphs.get(run.networkVersionId);
    const paths = row.productsLost.length > 0 ? failurePathsOf(graph, code) : [];
    // A plant manager sees the row as computed, but only their plants' products and paths.
    const products = row.products.filter((p) => scope === null || scope.includes(p.plantCode));
    const shown = new Set(products.map((p) => p.code));
    return {
      ...row,
      products,
      runId,
      networkVersionId: run.networkVersionId,
      failurePaths: paths.filter((path) => shown.has(path.product)),
      history: this.results.history(code),
      registerEntryId: this.results.registerEntryId(code),
    };
  }

  /** Counts per heat-map cell within the scope; `cells[likelihood - 1][impactBand - 1]`. */
  heatMap(user: SessionUser, runId: number): HeatMapDto {
    this.readyRun(runId);
    const cells = Array.from({ length: 5 }, () => [0, 0, 0, 0, 0]);
    let total = 0;
    for (const key of this.rankings.get(runId).select({ plants: plantScopeOf(user) })) {
      cells[key.likelihood - 1]![key.impactBand - 1]!++;
      total++;
    }
    return { cells, total };
  }

  /** The first {@link PARETO_SIZE} suppliers by revenue impact and their running share. */
  pareto(user: SessionUser, runId: number): ParetoDto {
    this.readyRun(runId);
    const keys = this.rankings.get(runId).select({ plants: plantScopeOf(user) },
      'revenueImpact', 'desc');
    let total = 0;
    for (const key of keys) total += key.revenueImpact;
    let running = 0;
    const items = keys.slice(0, PARETO_SIZE).map(({ code, name, revenueImpact }) => {
      running += revenueImpact;
      return { code, name, revenueImpact,
        cumulativeShare: total > 0 ? Math.min(1, running / total) : 0 };
    });
    return { items, totalRevenueImpact: total };
  }

  /** The run, or 404; 409 `run_not_ready` unless it has succeeded. */
  readyRun(runId: number): RunRecord {
    const run = this.runs.find(runId);
    if (!run) throw notFound(`There is no analysis run ${runId}.`);
    if (run.status !== 'succeeded') {
      throw conflict(RUN_NOT_READY, `Analysis run ${runId} is ${run.status}; results exist ` +
        'only once it has succeeded.', { status: run.status });
    }
    return run;
  }

  private filterOf(user: SessionUser, query: ListRunSuppliersQuery): RankingFilter {
    const scope = plantScopeOf(user);
    checkPlantFilter(scope, query.plant);
    const { limit: _limit, offset: _offset, sort: _sort, order: _order, plant, ...filters } =
      query;
    return { ...filters, plants: effectivePlants(scope, plant) };
  }
}

function failurePathsOf(graph: SupplyGraph, code: string):
  RunSupplierDetailDto['failurePaths'] {
  try {
    return failurePaths(graph, code).map(toProductPath);
  } catch (error) {
    // The run's rows and the version's graph come from the same rows; a mismatch is a bug.
    throw new AppError('internal_error', 500,
      `Could not trace the failure paths of ${code}: ${(error as Error).message}`);
  }
}
