/**
 * Shortest-path betweenness restricted to pairs from a source set S to a target set T
 * (spec section 5):
 *
 *   b(v) = sum over s in S, t in T, s != t, v not in {s, t} of sigma_st(v) / sigma_st,
 *
 * unweighted, a pair with several shortest paths splitting its point equally. On the supply
 * graph S = suppliers with no Sourcing row as buyer (spec 8.11) and T = products; edges follow
 * the flow of material, so every counted path runs from a raw-material supplier to a product.
 *
 * Equals networkx 3.x `betweenness_centrality_subset(G, sources, targets, normalized=False)`:
 * directed graphs are NOT halved; undirected graphs are halved as networkx does; `normalized`
 * divides by (n - 1)(n - 2). Disconnected pairs add nothing.
 *
 * Complexity O(min(|S|, |T|) x (n + m)): the dependency of a pair is the same counted from either
 * end, so when T is smaller the searches start at the targets on the reversed graph and collect
 * at the sources.
 *
 * References: U. Brandes, "A faster algorithm for betweenness centrality", Journal of
 * Mathematical Sociology 25(2):163-177, 2001, doi:10.1080/0022250X.2001.9990249; U. Brandes,
 * "On variants of shortest-path betweenness centrality and their generic computation", Social
 * Networks 30(2):136-145, 2008, doi:10.1016/j.socnet.2007.11.001.
 */
import { reverseCsr, type CsrGraph } from '../csr-graph';
import { throwIfCancelled, type ProgressOptions } from '../errors';
import type { SupplyGraph } from '../supply-graph';
import { ShortestPathWorkspace } from './shortest-paths';

/** Options of {@link betweennessSubset}. */
export interface BetweennessSubsetOptions extends ProgressOptions {
  /** Source nodes; default for a SupplyGraph: suppliers with no Sourcing row as buyer. */
  sources?: ArrayLike<number>;
  /** Target nodes; default for a SupplyGraph: the products. */
  targets?: ArrayLike<number>;
  /** Divide by (n - 1)(n - 2); default false (the contract's unnormalised value). */
  normalized?: boolean;
  /** The reversed graph, when the caller has it (a SupplyGraph's in-adjacency is used). */
  reversed?: CsrGraph;
}

/** Defaults of {@link betweennessSubset}. */
export const BETWEENNESS_SUBSET_DEFAULTS = { normalized: false } as const;

/** Subset betweenness of every node (index order). */
export function betweennessSubset(
  graph: CsrGraph | SupplyGraph,
  options: BetweennessSubsetOptions = {},
): Float64Array {
  const supply = 'supplierNodes' in graph ? graph : undefined;
  const sources = options.sources ?? (supply ? supplySources(supply) : undefined);
  const targets = options.targets ?? supply?.productNodes;
  if (!sources || !targets) {
    throw new Error(
      'betweennessSubset: give sources and targets for a graph that is not a SupplyGraph',
    );
  }
  const { n } = graph;
  const isSource = membership(n, sources, 'sources');
  const isTarget = membership(n, targets, 'targets');
  const fromTargets = targets.length < sources.length;
  const searched = fromTargets ? (options.reversed ?? reversedOf(graph, supply)) : graph;
  const starts = fromTargets ? isTarget : isSource;
  const ends = fromTargets ? isSource : isTarget;
  const scores = new Float64Array(n);
  const workspace = new ShortestPathWorkspace(n);
  let done = 0;
  const total = fromTargets ? targets.length : sources.length;
  for (let s = 0; s < n; s++) {
    if (starts[s] === 0) continue;
    if ((done & 15) === 0) {
      throwIfCancelled(options.signal, 'betweenness');
      options.onProgress?.(done / total);
    }
    workspace.search(searched, s);
    workspace.accumulate(searched, scores, ends);
    done++;
  }
  const normalized = options.normalized ?? BETWEENNESS_SUBSET_DEFAULTS.normalized;
  const scale = subsetScale(n, normalized, graph.directed);
  if (scale !== 1) for (let v = 0; v < n; v++) scores[v]! *= scale;
  options.onProgress?.(1);
  return scores;
}

/** Suppliers that require nothing (spec 8.11), as node indices. */
function supplySources(graph: SupplyGraph): Int32Array {
  return graph.supplierNodes.filter((_, ordinal) => graph.requiresNothing[ordinal] === 1);
}

function membership(n: number, nodes: ArrayLike<number>, name: string): Uint8Array {
  const flags = new Uint8Array(n);
  for (let i = 0; i < nodes.length; i++) {
    const v = nodes[i]!;
    if (!Number.isInteger(v) || v < 0 || v >= n) {
      throw new RangeError(`betweennessSubset: ${name}[${i}] = ${v} is not a node index`);
    }
    flags[v] = 1;
  }
  return flags;
}

function reversedOf(graph: CsrGraph, supply: SupplyGraph | undefined): CsrGraph {
  if (supply) {
    return { n: supply.n, offsets: supply.inOffsets, targets: supply.inSources, directed: true };
  }
  return reverseCsr(graph);
}

/** networkx's `_rescale` of the subset variant. */
function subsetScale(n: number, normalized: boolean, directed: boolean): number {
  if (normalized) return n <= 2 ? 1 : 1 / ((n - 1) * (n - 2));
  return directed ? 1 : 0.5;
}
