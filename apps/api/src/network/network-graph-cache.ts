/**
 * The supply graph of a network version, built once and kept for the next request: a
 * supplier's risk page, a scenario and the network picture all need it, and building it reads
 * every row of the version. One cache per app (`FeatureDeps.graphs`), so a version's graph is
 * built once whichever screen asks first. An LRU of a few versions bounds memory.
 */
import type { KeelsonDatabase } from '@keelson/db';
import { buildSupplyGraph, tiers, type SupplyGraph } from '@keelson/supply-graph';
import { notFound } from '../http/app-error';
import { readNetworkModel } from './network-store';

/** A version's graph and its supplier tiers. */
export interface CachedGraph {
  graph: SupplyGraph;
  tiers: Map<string, number | null>;
}

/** How many versions' graphs are kept. */
export const GRAPH_CACHE_SIZE = 4;

/** Least-recently-used cache of built supply graphs by version id. */
export class NetworkGraphCache {
  private readonly entries = new Map<number, CachedGraph>();

  constructor(
    private readonly db: KeelsonDatabase,
    private readonly size = GRAPH_CACHE_SIZE,
  ) {}

  /** The graph of version `versionId`; 404 when the version does not exist. */
  get(versionId: number): CachedGraph {
    const hit = this.entries.get(versionId);
    if (hit) {
      // Re-insert so that Map order is least recently used first.
      this.entries.delete(versionId);
      this.entries.set(versionId, hit);
      return hit;
    }
    const model = readNetworkModel(this.db, versionId);
    if (!model) throw notFound(`There is no network version ${versionId}.`);
    const graph = buildSupplyGraph(model);
    const entry = { graph, tiers: tiers(graph) };
    this.entries.set(versionId, entry);
    while (this.entries.size > this.size) {
      this.entries.delete(this.entries.keys().next().value!);
    }
    return entry;
  }

  /** Version ids held, least recently used first (for specs). */
  get versionIds(): number[] {
    return [...this.entries.keys()];
  }
}
