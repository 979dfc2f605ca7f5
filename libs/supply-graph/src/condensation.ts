/**
 * Strongly connected components and a topological order of the condensation, by Tarjan's
 * algorithm written with explicit stacks (no recursion, so graphs of a million nodes do not
 * overflow the call stack). O(n + m) time, O(n) memory.
 *
 * Reference: R. E. Tarjan, "Depth-first search and linear graph algorithms", SIAM Journal on
 * Computing 1(2):146-160, 1972, doi:10.1137/0201010.
 */
import type { CsrGraph } from './csr-graph';

/** The condensation of a directed graph, with nodes laid out in topological order. */
export interface Condensation {
  /** Number of components. */
  readonly componentCount: number;
  /** Component of each node; components are numbered in topological order (edges go up). */
  readonly componentOf: Int32Array;
  /** Nodes sorted by component: `order[position]` is a node. */
  readonly order: Int32Array;
  /** Position of each node in `order`. */
  readonly positionOf: Int32Array;
  /** `componentCount + 1` offsets: component c occupies positions `start[c] .. start[c+1]-1`. */
  readonly componentStart: Int32Array;
}

/** Tarjan's SCCs of a directed CSR graph, numbered so each edge u->v has comp(u) <= comp(v). */
export function condense(graph: CsrGraph): Condensation {
  const { n, offsets, targets } = graph;
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const onStack = new Uint8Array(n);
  const stack = new Int32Array(n);
  const callNode = new Int32Array(n);
  const callEdge = new Int32Array(n);
  const tarjanComponent = new Int32Array(n);
  let stackTop = 0;
  let nextIndex = 0;
  let components = 0;

  for (let root = 0; root < n; root++) {
    if (index[root] !== -1) continue;
    let depth = 0;
    callNode[0] = root;
    callEdge[0] = offsets[root]!;
    index[root] = low[root] = nextIndex++;
    stack[stackTop++] = root;
    onStack[root] = 1;
    while (depth >= 0) {
      const v = callNode[depth]!;
      const edge = callEdge[depth]!;
      if (edge < offsets[v + 1]!) {
        callEdge[depth] = edge + 1;
        const w = targets[edge]!;
        if (index[w] === -1) {
          index[w] = low[w] = nextIndex++;
          stack[stackTop++] = w;
          onStack[w] = 1;
          depth++;
          callNode[depth] = w;
          callEdge[depth] = offsets[w]!;
        } else if (onStack[w] === 1 && index[w]! < low[v]!) {
          low[v] = index[w]!;
        }
        continue;
      }
      if (low[v] === index[v]) {
        let w: number;
        do {
          w = stack[--stackTop]!;
          onStack[w] = 0;
          tarjanComponent[w] = components;
        } while (w !== v);
        components++;
      }
      depth--;
      if (depth >= 0) {
        const parent = callNode[depth]!;
        if (low[v]! < low[parent]!) low[parent] = low[v]!;
      }
    }
  }

  // Tarjan completes sinks first: reverse the numbering for a topological order.
  const componentOf = new Int32Array(n);
  const componentStart = new Int32Array(components + 1);
  for (let v = 0; v < n; v++) {
    const c = components - 1 - tarjanComponent[v]!;
    componentOf[v] = c;
    componentStart[c + 1]!++;
  }
  for (let c = 0; c < components; c++) componentStart[c + 1]! += componentStart[c]!;
  const fill = componentStart.slice(0, components);
  const order = new Int32Array(n);
  const positionOf = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    const position = fill[componentOf[v]!]!++;
    order[position] = v;
    positionOf[v] = position;
  }
  return { componentCount: components, componentOf, order, positionOf, componentStart };
}
