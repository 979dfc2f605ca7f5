/**
 * Degree centrality, as networkx 3.x `degree_centrality`:
 *
 *   C(v) = deg(v) / (n - 1),
 *
 * where deg counts neighbours in an undirected graph and in-plus-out arcs in a directed one
 * (networkx's degree of a DiGraph). For n <= 1 every node scores 1, as networkx returns.
 * Isolated nodes score 0; components do not matter. O(n + m).
 *
 * Reference: L. C. Freeman, "Centrality in networks: I. Conceptual clarification", Social
 * Networks 1(3):215-239, 1979, doi:10.1016/0378-8733(78)90021-7.
 */
import type { CsrGraph } from '../csr-graph';

/** Options of {@link degreeCentrality} (none yet; kept for the common measure signature). */
export type DegreeOptions = Record<string, never>;

/** Defaults of {@link degreeCentrality}. */
export const DEGREE_DEFAULTS = {} as const;

/** Degree centrality of every node (index order). */
export function degreeCentrality(graph: CsrGraph, _options: DegreeOptions = {}): Float64Array {
  const { n, offsets, targets } = graph;
  const scores = new Float64Array(n);
  if (n <= 1) return scores.fill(1);
  for (let v = 0; v < n; v++) scores[v] = offsets[v + 1]! - offsets[v]!;
  if (graph.directed) for (let e = 0; e < targets.length; e++) scores[targets[e]!]!++;
  // networkx multiplies by s = 1 / (n - 1) rather than dividing; do the same, bit for bit.
  const s = 1 / (n - 1);
  for (let v = 0; v < n; v++) scores[v]! *= s;
  return scores;
}
