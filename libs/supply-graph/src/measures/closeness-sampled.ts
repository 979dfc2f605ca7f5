/**
 * Closeness estimated from a seeded sample of pivot nodes, for networks too large for the exact
 * all-sources search in the time an analysis may take. Same definition as
 * {@link closenessCentrality} (networkx 3.x, Wasserman-Faust scaling):
 *
 *   C(u) = (r - 1) / D(u) x (r - 1) / (n - 1),
 *
 * with r the size of u's component, exact (components are labelled first), and D(u), the sum of
 * u's distances to the nodes of its component, estimated as r x the mean distance from u to
 * k pivots drawn uniformly without replacement from that component (Eppstein and Wang's
 * estimator). Each component gets pivots in proportion to its size, at least one; a component
 * with no more nodes than its share is searched from every node, so its values are exact.
 *
 * The relative standard error of each D(u) is estimated from the sample (with the finite
 * population correction) and reported, so the screens can say how close the numbers are.
 * Undirected graphs only. The pivots are searched 512 at a time by the bit-parallel search of
 * contracted-search.ts: O(k / 512 x (n + m) x levels) word operations, O(n) memory.
 *
 * Reference: D. Eppstein and J. Wang, "Fast approximation of centrality", Journal of Graph
 * Algorithms and Applications 8(1):39-45, 2004, doi:10.7155/jgaa.00081.
 */
import type { CsrGraph } from '../csr-graph';
import { throwIfCancelled, type ProgressOptions } from '../errors';
import { mulberry32 } from '../random';
import { ContractedSearch, contractGraph } from './contracted-search';

/** Options of {@link sampledCloseness}. */
export interface SampledClosenessOptions extends ProgressOptions {
  /** Compute only these nodes; the others are NaN. Default: every node. */
  nodes?: ArrayLike<number>;
  /** Pivots over the whole graph, shared out by component size; default 1024. */
  pivots?: number;
  /** Seed of the pivot draw; the same seed gives the same values. */
  seed?: number;
}

/** Defaults of {@link sampledCloseness}. */
export const SAMPLED_CLOSENESS_DEFAULTS = { pivots: 1024, seed: 20_260_301 } as const;

/** Estimated closeness and how precise it is. */
export interface SampledCloseness {
  /** Closeness per node (index order; NaN for nodes not requested). */
  scores: Float64Array;
  /** Pivots searched from. */
  pivots: number;
  seed: number;
  /** Largest and median relative standard error of the requested nodes' distance sums. */
  maxRelativeStandardError: number;
  medianRelativeStandardError: number;
}

/** Closeness of the requested nodes, estimated from pivots (see the file header). */
export function sampledCloseness(
  graph: CsrGraph,
  options: SampledClosenessOptions = {},
): SampledCloseness {
  if (graph.directed) throw new Error('sampledCloseness: the graph must be undirected');
  const { n } = graph;
  const budget = Math.max(1, Math.floor(options.pivots ?? SAMPLED_CLOSENESS_DEFAULTS.pivots));
  const seed = options.seed ?? SAMPLED_CLOSENESS_DEFAULTS.seed;
  const random = mulberry32(seed);
  const requested = options.nodes ? Int32Array.from(options.nodes) : null;
  const { component, members, starts } = components(graph);
  const componentCount = starts.length - 1;

  // Pivots per component, drawn by a partial Fisher-Yates shuffle of its members.
  const pivotList: number[] = [];
  const pivotsOf = new Int32Array(componentCount);
  for (let c = 0; c < componentCount; c++) {
    const size = starts[c + 1]! - starts[c]!;
    const share = Math.min(size, Math.max(1, Math.round((budget * size) / n)));
    pivotsOf[c] = share;
    const pool = members.subarray(starts[c]!, starts[c + 1]!);
    for (let i = 0; i < share; i++) {
      const j = i + Math.floor(random() * (size - i));
      [pool[i], pool[j]] = [pool[j]!, pool[i]!];
      pivotList.push(pool[i]!);
    }
  }

  const nodes = requested ?? Int32Array.from({ length: n }, (_, v) => v);
  for (const v of nodes) {
    if (!Number.isInteger(v) || v < 0 || v >= n) {
      throw new RangeError(`sampledCloseness: node ${v} is not a node index`);
    }
  }
  // Bit-parallel search from the pivots, 512 per pass, on the graph with low-degree nodes
  // that are neither pivots nor requested contracted away (contracted-search.ts).
  const isSource = new Uint8Array(n);
  for (const v of nodes) isSource[v] = 1;
  for (const p of pivotList) isSource[p] = 1;
  const contracted = contractGraph(graph, isSource);
  const kept = contracted.keptCount;
  const perNode = {
    isTracked: new Uint8Array(kept),
    sum: new Float64Array(kept),
    sumOfSquares: new Float64Array(kept),
  };
  for (const v of nodes) perNode.isTracked[contracted.keptOf[v]!] = 1;
  const words = 16;
  const batch = 32 * words;
  const search = new ContractedSearch(contracted, words, n);
  const sources = new Int32Array(batch);
  for (let start = 0; start < pivotList.length; start += batch) {
    throwIfCancelled(options.signal, 'closeness');
    options.onProgress?.(start / pivotList.length);
    const count = Math.min(batch, pivotList.length - start);
    for (let i = 0; i < count; i++) sources[i] = contracted.keptOf[pivotList[start + i]!]!;
    search.run(sources, count, perNode);
  }

  const scores = new Float64Array(n).fill(requested ? Number.NaN : 0);
  const errors: number[] = [];
  for (const v of nodes) {
    const c = component[v]!;
    const size = starts[c + 1]! - starts[c]!;
    const k = pivotsOf[c]!;
    const keptIndex = contracted.keptOf[v]!;
    const mean = perNode.sum[keptIndex]! / k;
    const total = mean * size;
    scores[v] = total > 0 && n > 1 ? ((size - 1) / total) * ((size - 1) / (n - 1)) : 0;
    if (k < size && mean > 0) {
      const meanSquare = perNode.sumOfSquares[keptIndex]! / k;
      const variance = Math.max(0, meanSquare - mean * mean) * (k / Math.max(1, k - 1));
      errors.push(Math.sqrt((variance / k) * (1 - k / size)) / mean);
    } else {
      errors.push(0);
    }
  }
  options.onProgress?.(1);
  errors.sort((a, b) => a - b);
  return {
    scores,
    pivots: pivotList.length,
    seed,
    maxRelativeStandardError: errors.at(-1) ?? 0,
    medianRelativeStandardError: errors[Math.floor(errors.length / 2)] ?? 0,
  };
}

/** Connected components: label per node, and members grouped by component. */
function components(graph: CsrGraph) {
  const { n, offsets, targets } = graph;
  const component = new Int32Array(n).fill(-1);
  const members = new Int32Array(n);
  const starts: number[] = [0];
  let tail = 0;
  for (let root = 0; root < n; root++) {
    if (component[root] !== -1) continue;
    const label = starts.length - 1;
    component[root] = label;
    let head = tail;
    members[tail++] = root;
    for (; head < tail; head++) {
      const v = members[head]!;
      for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
        const w = targets[e]!;
        if (component[w] === -1) {
          component[w] = label;
          members[tail++] = w;
        }
      }
    }
    starts.push(tail);
  }
  return { component, members, starts: Int32Array.from(starts) };
}
