/**
 * The multi-source closeness (bit-parallel, several words per pass, bit-sliced counters)
 * against plain one-source-at-a-time breadth-first search written here, on seeded random graphs
 * full of degree-2 nodes (subdivided edges), chains, triangles and disconnected parts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csrFromArrays, type CsrGraph } from '../csr-graph';
import { closenessCentrality } from './closeness';

/** networkx's formula with one BFS per node (the definition, not our algorithm). */
function plainCloseness(graph: CsrGraph, v: number): number {
  const distance = new Int32Array(graph.n).fill(-1);
  distance[v] = 0;
  const queue = [v];
  let total = 0;
  for (let head = 0; head < queue.length; head++) {
    const u = queue[head]!;
    total += distance[u]!;
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) {
      const w = graph.targets[e]!;
      if (distance[w] === -1) {
        distance[w] = distance[u]! + 1;
        queue.push(w);
      }
    }
  }
  const reached = queue.length - 1;
  return total > 0 && graph.n > 1 ? (reached / total) * (reached / (graph.n - 1)) : 0;
}

const graphs = fc
  .record({
    n: fc.integer({ min: 2, max: 60 }),
    edges: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 120 }),
    subdivide: fc.array(fc.boolean(), { minLength: 120, maxLength: 120 }),
  })
  .map(({ n, edges, subdivide }) => {
    // Subdividing an edge u-v into u-x-v adds a degree-2 node x.
    const from: number[] = [];
    const to: number[] = [];
    let next = n;
    edges.forEach(([a, b], i) => {
      const u = a % n;
      const v = b % n;
      if (subdivide[i]) {
        from.push(u, next);
        to.push(next, v);
        next++;
      } else {
        from.push(u);
        to.push(v);
      }
    });
    return csrFromArrays(next, Int32Array.from(from), Int32Array.from(to), false);
  });

describe('closenessCentrality (multi-source)', () => {
  it('equals one BFS per node for every node and every word count', () => {
    fc.assert(
      fc.property(graphs, fc.integer({ min: 1, max: 3 }), (graph, words) => {
        const scores = closenessCentrality(graph, { wordsPerPass: words });
        for (let v = 0; v < graph.n; v++) {
          expect(scores[v]).toBeCloseTo(plainCloseness(graph, v), 12);
        }
      }),
      { numRuns: 150 },
    );
  });
  it('equals one BFS per node for a subset of nodes (the others NaN)', () => {
    fc.assert(
      fc.property(graphs, fc.array(fc.nat(), { minLength: 1, maxLength: 40 }), (graph, picks) => {
        const nodes = Int32Array.from(new Set(picks.map((p) => p % graph.n)));
        const scores = closenessCentrality(graph, { nodes, wordsPerPass: 1 });
        for (const v of nodes) expect(scores[v]).toBeCloseTo(plainCloseness(graph, v), 12);
        const left = Array.from({ length: graph.n }, (_, v) => v).filter((v) => !nodes.includes(v));
        for (const v of left) expect(scores[v]).toBeNaN();
      }),
      { numRuns: 300 },
    );
  });
  it('uses incoming distances on a directed graph, as networkx does', () => {
    // a -> b -> c: c is reached from a (2) and b (1); a from nobody.
    const graph = csrFromArrays(3, Int32Array.from([0, 1]), Int32Array.from([1, 2]), true);
    const scores = closenessCentrality(graph);
    expect(scores[0]).toBe(0);
    expect(scores[2]).toBeCloseTo((2 / 3) * (2 / 2), 15);
  });
  it('rejects a requested index that is not a node', () => {
    const graph = csrFromArrays(2, Int32Array.from([0]), Int32Array.from([1]), false);
    expect(() => closenessCentrality(graph, { nodes: [5] })).toThrow(/node 5 is not a node index/);
  });
});
