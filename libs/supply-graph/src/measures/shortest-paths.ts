/**
 * Single-source shortest paths by breadth-first search with path counts (the first phase of
 * Brandes' algorithm), and the dependency accumulation of its second phase written over
 * successors, so that only the CSR graph being searched is needed. Shared by `betweenness` and
 * `betweennessSubset`. O(n + m) per source; workspaces are reused across sources.
 *
 * Reference: U. Brandes, "A faster algorithm for betweenness centrality", Journal of
 * Mathematical Sociology 25(2):163-177, 2001, doi:10.1080/0022250X.2001.9990249.
 */
import type { CsrGraph } from '../csr-graph';

/** Reusable arrays for one search at a time. */
export class ShortestPathWorkspace {
  /** Hop distance from the source; -1 when not reached. */
  readonly distance: Int32Array;
  /** Number of shortest paths from the source. */
  readonly sigma: Float64Array;
  /** Dependency of the source on each node (filled by the accumulation). */
  readonly delta: Float64Array;
  /** Reached nodes in breadth-first order (non-decreasing distance). */
  readonly order: Int32Array;
  /** How many entries of `order` the last search filled. */
  reached = 0;

  constructor(n: number) {
    this.distance = new Int32Array(n).fill(-1);
    this.sigma = new Float64Array(n);
    this.delta = new Float64Array(n);
    this.order = new Int32Array(n);
  }

  /** Breadth-first search from `source` over `graph`'s adjacency, counting shortest paths. */
  search(graph: CsrGraph, source: number): void {
    const { distance, sigma, delta, order } = this;
    for (let i = 0; i < this.reached; i++) {
      const v = order[i]!;
      distance[v] = -1;
      sigma[v] = 0;
      delta[v] = 0;
    }
    const { offsets, targets } = graph;
    distance[source] = 0;
    sigma[source] = 1;
    order[0] = source;
    let tail = 1;
    for (let head = 0; head < tail; head++) {
      const v = order[head]!;
      const next = distance[v]! + 1;
      for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
        const w = targets[e]!;
        if (distance[w] === -1) {
          distance[w] = next;
          order[tail++] = w;
        }
        if (distance[w] === next) sigma[w]! += sigma[v]!;
      }
    }
    this.reached = tail;
  }

  /**
   * Brandes' accumulation after {@link search}: delta(v) = sum over successors w on shortest
   * paths of sigma(v) / sigma(w) x (end(w) + delta(w)), where end(w) is 1 when pairs ending at w
   * count (every node, or only the members of `endpoints`). Adds delta(v) to `scores[v]` for
   * every reached v other than the source.
   */
  accumulate(graph: CsrGraph, scores: Float64Array, endpoints?: Uint8Array): void {
    const { distance, sigma, delta, order } = this;
    const { offsets, targets } = graph;
    const source = order[0]!;
    for (let i = this.reached - 1; i >= 0; i--) {
      const v = order[i]!;
      const next = distance[v]! + 1;
      let sum = 0;
      for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
        const w = targets[e]!;
        if (distance[w] !== next) continue;
        const end = endpoints === undefined ? 1 : w === source ? 0 : endpoints[w]!;
        sum += sigma[v]! * ((end + delta[w]!) / sigma[w]!);
      }
      delta[v] = sum;
      if (v !== source) scores[v]! += sum;
    }
  }
}
