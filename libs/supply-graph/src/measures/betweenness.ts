/**
 * Shortest-path betweenness centrality over all pairs (Brandes):
 *
 *   b(v) = sum over s != v != t of sigma_st(v) / sigma_st,
 *
 * where sigma_st counts shortest s-t paths and sigma_st(v) those through v; a pair with several
 * shortest paths splits its point equally. Unweighted (hop counts). O(n m) time, O(n + m) memory.
 *
 * Normalisation as networkx 3.x `betweenness_centrality` (endpoints excluded): raw values are
 * halved on undirected graphs (each unordered pair is searched from both ends); normalised values
 * divide the unhalved sums by (n - 1)(n - 2), for directed and undirected graphs alike; graphs of
 * two nodes or fewer are left as they are. Disconnected graphs: unreachable pairs add nothing.
 * Used on the reference datasets and the benchmark; the supply graph's own measure is
 * `betweennessSubset`.
 *
 * References: U. Brandes, "A faster algorithm for betweenness centrality", Journal of
 * Mathematical Sociology 25(2):163-177, 2001, doi:10.1080/0022250X.2001.9990249;
 * L. C. Freeman, "A set of measures of centrality based on betweenness", Sociometry
 * 40(1):35-41, 1977, doi:10.2307/3033543.
 */
import type { CsrGraph } from '../csr-graph';
import { throwIfCancelled, type ProgressOptions } from '../errors';
import { ShortestPathWorkspace } from './shortest-paths';

/** Options of {@link betweenness}. */
export interface BetweennessOptions extends ProgressOptions {
  /** Divide by (n - 1)(n - 2) as networkx does; default true (networkx's default). */
  normalized?: boolean;
}

/** Defaults of {@link betweenness}. */
export const BETWEENNESS_DEFAULTS = { normalized: true } as const;

/** Betweenness of every node (index order). */
export function betweenness(graph: CsrGraph, options: BetweennessOptions = {}): Float64Array {
  const normalized = options.normalized ?? BETWEENNESS_DEFAULTS.normalized;
  const { n } = graph;
  const scores = new Float64Array(n);
  const workspace = new ShortestPathWorkspace(n);
  for (let s = 0; s < n; s++) {
    if ((s & 63) === 0) {
      throwIfCancelled(options.signal, 'betweenness');
      options.onProgress?.(s / n);
    }
    workspace.search(graph, s);
    workspace.accumulate(graph, scores);
  }
  const scale = betweennessScale(n, normalized, graph.directed);
  if (scale !== 1) for (let v = 0; v < n; v++) scores[v]! *= scale;
  options.onProgress?.(1);
  return scores;
}

/** networkx's rescaling of all-pairs betweenness (k = None, endpoints = False). */
function betweennessScale(n: number, normalized: boolean, directed: boolean): number {
  if (n - 1 < 2) return 1;
  if (normalized) return 1 / ((n - 1) * (n - 2));
  return directed ? 1 : 0.5;
}
