/**
 * Compressed sparse row (CSR) adjacency: the compact graph every measure and hot loop runs on.
 * Node `v`'s neighbours are `targets[offsets[v]] .. targets[offsets[v + 1] - 1]`. A directed graph
 * stores out-neighbours; an undirected graph stores every edge in both directions. Both the
 * reference datasets and {@link SupplyGraph} provide this shape, so one implementation of each
 * measure serves both.
 */

/** A graph as CSR arrays over nodes `0 .. n-1`. */
export interface CsrGraph {
  /** Number of nodes. */
  readonly n: number;
  /** `n + 1` offsets into `targets`. */
  readonly offsets: Int32Array;
  /** Neighbour indices (out-neighbours when directed; both directions when undirected). */
  readonly targets: Int32Array;
  /** Whether edges are directed. */
  readonly directed: boolean;
}

/** A CSR graph plus stable names for its nodes, as built from an edge list. */
export interface NamedCsrGraph<Id> extends CsrGraph {
  /** Node ids in index order. */
  readonly ids: readonly Id[];
  /** Index of each id. */
  readonly indexOf: ReadonlyMap<Id, number>;
}

/**
 * Builds a CSR graph from node ids and `[u, v]` edge pairs. Undirected graphs store each edge
 * both ways. Repeated edges are kept once and self-loops are dropped: the measures here are
 * defined for simple graphs. Throws when an edge names an unknown node.
 */
export function csrFromEdges<Id>(
  nodes: readonly Id[],
  edges: ReadonlyArray<readonly [Id, Id]>,
  directed: boolean,
): NamedCsrGraph<Id> {
  const indexOf = new Map<Id, number>();
  nodes.forEach((id, index) => {
    if (indexOf.has(id)) throw new Error(`csrFromEdges: node ${String(id)} is listed twice`);
    indexOf.set(id, index);
  });
  const from: number[] = [];
  const to: number[] = [];
  edges.forEach(([u, v], position) => {
    const a = indexOf.get(u);
    const b = indexOf.get(v);
    if (a === undefined || b === undefined) {
      const missing = a === undefined ? u : v;
      throw new Error(`csrFromEdges: edge ${position} names unknown node ${String(missing)}`);
    }
    from.push(a);
    to.push(b);
  });
  const graph = csrFromArrays(nodes.length, Int32Array.from(from), Int32Array.from(to), directed);
  return { ...graph, ids: nodes, indexOf };
}

/**
 * Builds a CSR graph from parallel arrays of edge ends. Keeps each neighbour's edges in input
 * order, removes repeats and self-loops; undirected input is mirrored.
 */
export function csrFromArrays(
  n: number,
  from: Int32Array,
  to: Int32Array,
  directed: boolean,
): CsrGraph {
  const count = new Int32Array(n + 1);
  const mirrored = directed ? 1 : 2;
  for (let e = 0; e < from.length; e++) {
    if (from[e] === to[e]) continue;
    count[from[e]! + 1]!++;
    if (!directed) count[to[e]! + 1]!++;
  }
  for (let v = 0; v < n; v++) count[v + 1]! += count[v]!;
  const fill = count.slice(0, n);
  const raw = new Int32Array(count[n]!);
  for (let e = 0; e < from.length; e++) {
    const u = from[e]!;
    const v = to[e]!;
    if (u === v) continue;
    raw[fill[u]!++] = v;
    if (mirrored === 2) raw[fill[v]!++] = u;
  }
  return dedupe({ n, offsets: count, targets: raw, directed });
}

/** Removes repeated neighbours within each node's list, keeping first occurrences. */
function dedupe(graph: CsrGraph): CsrGraph {
  const { n, offsets, targets } = graph;
  const mark = new Int32Array(n).fill(-1);
  const outOffsets = new Int32Array(n + 1);
  const outTargets = new Int32Array(targets.length);
  let k = 0;
  for (let v = 0; v < n; v++) {
    for (let i = offsets[v]!; i < offsets[v + 1]!; i++) {
      const w = targets[i]!;
      if (mark[w] === v) continue;
      mark[w] = v;
      outTargets[k++] = w;
    }
    outOffsets[v + 1] = k;
  }
  const trimmed = k === targets.length ? outTargets : outTargets.slice(0, k);
  return { n, offsets: outOffsets, targets: trimmed, directed: graph.directed };
}

/** The reverse of a directed graph (in-neighbours as CSR); an undirected graph comes back as is. */
export function reverseCsr(graph: CsrGraph): CsrGraph {
  if (!graph.directed) return graph;
  const { n, offsets, targets } = graph;
  const count = new Int32Array(n + 1);
  for (let i = 0; i < targets.length; i++) count[targets[i]! + 1]!++;
  for (let v = 0; v < n; v++) count[v + 1]! += count[v]!;
  const fill = count.slice(0, n);
  const reversed = new Int32Array(targets.length);
  for (let u = 0; u < n; u++) {
    for (let i = offsets[u]!; i < offsets[u + 1]!; i++) reversed[fill[targets[i]!]!++] = u;
  }
  return { n, offsets: count, targets: reversed, directed: true };
}

/**
 * The undirected, unweighted version of a graph (networkx `G.to_undirected()`): u-v is an edge
 * when u->v or v->u is; each neighbour once; no self-loops.
 */
export function undirectedCsr(graph: CsrGraph): CsrGraph {
  if (!graph.directed) return graph;
  const { n, offsets, targets } = graph;
  const from = new Int32Array(targets.length);
  for (let u = 0; u < n; u++) from.fill(u, offsets[u]!, offsets[u + 1]!);
  return csrFromArrays(n, from, targets, false);
}

/** Number of edges: arcs of a directed graph, or each undirected edge once. */
export function edgeCount(graph: CsrGraph): number {
  return graph.directed ? graph.targets.length : graph.targets.length / 2;
}
