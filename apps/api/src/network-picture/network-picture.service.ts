import { RUN_NOT_READY } from '@keelson/contracts';
import type { SupplyGraph } from '@keelson/supply-graph';
import { conflict, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { NetworkGraphCache } from '../network/network-graph-cache';
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
}

/**
 * The picture of a network version: every node and edge a user may see, or above a size the
 * grouped form, with a run's single points of failure marked. The graph comes from the app's
 * shared graph cache; the layers and labels derived from it are kept as long as that graph is.
 */
export class NetworkPictureService {
  private readonly bases = new WeakMap<SupplyGraph, PictureBase>();
  private readonly aggregateAbove: number;

  constructor(
    private readonly repository: NetworkPictureRepository,
    private readonly graphs: NetworkGraphCache,
    options: NetworkPictureOptions = {},
  ) {
    this.aggregateAbove = options.aggregateAbove ?? AGGREGATE_ABOVE_NODES;
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
    const { graph } = this.graphs.get(versionId);
    let base = this.bases.get(graph);
    if (!base) {
      base = pictureBase(graph);
      this.bases.set(graph, base);
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
