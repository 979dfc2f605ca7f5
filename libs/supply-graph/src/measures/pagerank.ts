/**
 * PageRank by networkx 3.x's iteration (`pagerank`, the sparse-matrix form):
 *
 *   x_0 = 1/n;  x_{k+1}(v) = alpha (sum over u -> v of x_k(u) / deg_out(u) + D_k / n)
 *                            + (1 - alpha) / n,
 *
 * with D_k the mass on dangling nodes (no out-edges), spread uniformly; alpha 0.85; stop when
 * sum |x_{k+1} - x_k| < n x tolerance (1e-6), at most `maxIterations` (100, networkx's default;
 * the error shrinks by alpha per step, so 100 always suffices at this tolerance), else
 * {@link ConvergenceError}. Undirected graphs use each edge both ways. Values sum to 1;
 * disconnected graphs need no special case (teleportation joins them). O(iterations x (n + m)).
 *
 * Reference: S. Brin and L. Page, "The anatomy of a large-scale hypertextual Web search engine",
 * Computer Networks and ISDN Systems 30(1-7):107-117, 1998, doi:10.1016/S0169-7552(98)00110-X.
 */
import type { CsrGraph } from '../csr-graph';
import { ConvergenceError, throwIfCancelled, type ProgressOptions } from '../errors';

/** Options of {@link pagerank}. */
export interface PagerankOptions extends ProgressOptions {
  /** Damping factor; default 0.85. */
  alpha?: number;
  /** Iterations allowed before {@link ConvergenceError}; default 100. */
  maxIterations?: number;
  /** Per-node tolerance: stop when the L1 change is below n x tolerance; default 1e-6. */
  tolerance?: number;
}

/** Defaults of {@link pagerank}. */
export const PAGERANK_DEFAULTS = { alpha: 0.85, maxIterations: 100, tolerance: 1e-6 } as const;

/** PageRank of every node (index order); empty for an empty graph. */
export function pagerank(graph: CsrGraph, options: PagerankOptions = {}): Float64Array {
  const alpha = options.alpha ?? PAGERANK_DEFAULTS.alpha;
  const maxIterations = options.maxIterations ?? PAGERANK_DEFAULTS.maxIterations;
  const tolerance = options.tolerance ?? PAGERANK_DEFAULTS.tolerance;
  if (!(alpha >= 0 && alpha <= 1)) {
    throw new RangeError(`pagerank: alpha ${alpha} is not in [0, 1]`);
  }
  const { n, offsets, targets } = graph;
  let x = new Float64Array(n).fill(1 / n);
  let last = new Float64Array(n);
  if (n === 0) return x;
  const inverseDegree = new Float64Array(n);
  const dangling: number[] = [];
  for (let u = 0; u < n; u++) {
    const degree = offsets[u + 1]! - offsets[u]!;
    if (degree === 0) dangling.push(u);
    else inverseDegree[u] = 1 / degree;
  }
  const p = 1 / n;
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    if ((iteration & 15) === 0) throwIfCancelled(options.signal, 'pagerank');
    [last, x] = [x, last];
    x.fill(0);
    for (let u = 0; u < n; u++) {
      const share = last[u]! * inverseDegree[u]!;
      for (let e = offsets[u]!; e < offsets[u + 1]!; e++) x[targets[e]!]! += share;
    }
    let danglingSum = 0;
    for (const u of dangling) danglingSum += last[u]!;
    let change = 0;
    for (let v = 0; v < n; v++) {
      x[v] = alpha * (x[v]! + danglingSum * p) + (1 - alpha) * p;
      change += Math.abs(x[v]! - last[v]!);
    }
    if (change < n * tolerance) return x;
  }
  throw new ConvergenceError('pagerank', maxIterations);
}
