import { RUN_NOT_READY } from '@keelson/contracts';
import { buildSupplyGraph } from '@keelson/supply-graph';
import { conflict, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { plantScopeOf, type PlantScope } from '../network/plant-scope';
import {
  aggregatedPicture,
  fullPicture,
  pictureBase,
  visibleCounts,
  visibleNodes,
  type PictureBase,
  type RunMarks,
} from './network-picture-builder';
import {
  AGGREGATE_ABOVE_NODES,
  type NetworkPictureDto,
  type NetworkPictureQuery,
} from './network-picture-dto';
import type { NetworkPictureRepository } from './network-picture.repository';

/** Options of {@link NetworkPictureService}. */
export interface NetworkPictureOptions {
  /** Visible nodes above which the picture is grouped; {@link AGGREGATE_ABOVE_NODES}. */
  aggregateAbove?: number;
  /** Versions whose graph is kept in memory (least recently used dropped first); 4. */
  cachedVersions?: number;
}

/**
 * The picture of a network version: every node and edge a user may see, or above a size the
 * grouped form, with a run's single points of failure marked. The graph of a version is built
 * once and kept (versions never change), for the few most recently drawn versions.
 */
export class NetworkPictureService {
  private readonly cache = new Map<number, PictureBase>();
  private readonly aggregateAbove: number;
  private readonly cachedVersions: number;

  constructor(
    private readonly repository: NetworkPictureRepository,
    options: NetworkPictureOptions = {},
  ) {
    this.aggregateAbove = options.aggregateAbove ?? AGGREGATE_ABOVE_NODES;
    this.cachedVersions = options.cachedVersions ?? 4;
  }

  /** The picture of version `versionId` for `user`. */
  picture(user: SessionUser, versionId: number, query: NetworkPictureQuery): NetworkPictureDto {
    const scope = plantScopeOf(user);
    const marks = query.runId === undefined ? null : this.marks(versionId, query.runId, scope);
    const base = this.base(versionId);
    const visible = visibleNodes(base, scope);
    const totals = visibleCounts(base, visible);
    const isAggregated = query.mode === 'aggregated' || totals.nodes > this.aggregateAbove;
    const parts = isAggregated
      ? aggregatedPicture(base, visible, marks)
      : fullPicture(base, visible, marks);
    let singlePoints = 0;
    if (marks) {
      for (const s of base.graph.supplierNodes) {
        if (visible[s] && marks.singlePoints.has(base.graph.nodes[s]!.code)) singlePoints++;
      }
    }
    return {
      networkVersionId: versionId,
      runId: query.runId ?? null,
      mode: isAggregated ? 'aggregated' : 'full',
      totalNodes: totals.nodes,
      totalEdges: totals.edges,
      singlePoints,
      ...parts,
    };
  }

  private base(versionId: number): PictureBase {
    const cached = this.cache.get(versionId);
    if (cached) {
      // Re-insert so the map's order stays least recently used first.
      this.cache.delete(versionId);
      this.cache.set(versionId, cached);
      return cached;
    }
    const model = this.repository.model(versionId);
    if (!model) throw notFound(`There is no network version ${versionId}.`);
    const base = pictureBase(buildSupplyGraph(model));
    this.cache.set(versionId, base);
    while (this.cache.size > this.cachedVersions) {
      this.cache.delete(this.cache.keys().next().value!);
    }
    return base;
  }

  /**
   * The run's marks. A plant manager sees a supplier's marks only when the run row touches one
   * of their plants, the same rows the ranking shows them.
   */
  private marks(versionId: number, runId: number, scope: PlantScope): RunMarks {
    const run = this.repository.run(runId);
    if (!run) throw notFound(`There is no analysis run ${runId}.`);
    if (run.networkVersionId !== versionId) {
      throw invalidRequest(
        `query.runId: run ${runId} analysed network version ${run.networkVersionId}, ` +
          `not version ${versionId}.`,
        { issues: [{ path: 'query.runId', message: 'The run is of another version.' }] },
      );
    }
    if (run.status !== 'succeeded') {
      throw conflict(RUN_NOT_READY,
        `Run ${runId} is ${run.status}; only a succeeded run has results to show.`,
        { runId, status: run.status });
    }
    const singlePoints = new Set<string>();
    const revenueImpact = new Map<string, number>();
    for (const row of this.repository.runSuppliers(runId)) {
      if (scope !== null && !row.plants.some((plant) => scope.includes(plant))) continue;
      if (row.singlePointOfFailure) singlePoints.add(row.code);
      revenueImpact.set(row.code, row.revenueImpact);
    }
    return { singlePoints, revenueImpact };
  }
}
