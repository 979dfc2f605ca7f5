/**
 * Eigenvector centrality and PageRank beyond the reference datasets: a dense cross-check with
 * ml-matrix's eigendecomposition (the Perron vector of A, which the A + I iteration approaches),
 * PageRank's stationary equation solved directly, error paths and edge cases.
 */
import { EigenvalueDecomposition, Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { csrFromEdges, type CsrGraph } from '../csr-graph';
import { ConvergenceError } from '../errors';
import { mulberry32 } from '../testing/mulberry32';
import { degreeCentrality } from './degree';
import { eigenvectorCentrality } from './eigenvector';
import { pagerank } from './pagerank';

/** A seeded connected graph: a random spanning tree plus random extra edges. */
function connectedGraph(seed: number, n: number): CsrGraph {
  const random = mulberry32(seed);
  const edges: Array<readonly [number, number]> = [];
  for (let v = 1; v < n; v++) edges.push([v, Math.floor(random() * v)]);
  for (let k = 0; k < n; k++) edges.push([Math.floor(random() * n), Math.floor(random() * n)]);
  return csrFromEdges(Array.from({ length: n }, (_, i) => i), edges, false);
}

function adjacency(graph: CsrGraph): Matrix {
  const a = Matrix.zeros(graph.n, graph.n);
  for (let u = 0; u < graph.n; u++) {
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) a.set(u, graph.targets[e]!, 1);
  }
  return a;
}

describe('eigenvectorCentrality', () => {
  it.each([11, 12, 13])('approaches the dense Perron vector of A (ml-matrix), seed %i', (seed) => {
    const graph = connectedGraph(seed, 25);
    const decomposition = new EigenvalueDecomposition(adjacency(graph), { assumeSymmetric: true });
    const values = decomposition.realEigenvalues;
    const top = values.indexOf(Math.max(...values));
    const vector = decomposition.eigenvectorMatrix.getColumn(top);
    const sign = Math.sign(vector.reduce((a, b) => a + b, 0));
    const norm = Math.hypot(...vector);
    const ours = eigenvectorCentrality(graph, { tolerance: 1e-13 });
    vector.forEach((value, v) => expect(ours[v]).toBeCloseTo((sign * value) / norm, 8));
  });
  it('has unit Euclidean norm', () => {
    const scores = eigenvectorCentrality(connectedGraph(5, 30));
    expect(Math.hypot(...scores)).toBeCloseTo(1, 12);
  });
  it('throws ConvergenceError naming the measure when the iteration cap is reached', () => {
    const run = () => eigenvectorCentrality(connectedGraph(5, 30), { maxIterations: 2 });
    expect(run).toThrow(ConvergenceError);
    expect(run).toThrow(/eigenvector power iteration did not converge within 2 iterations/);
  });
  it('returns an empty array for an empty graph', () => {
    const empty = { n: 0, offsets: new Int32Array(1), targets: new Int32Array(0), directed: false };
    expect(eigenvectorCentrality(empty)).toHaveLength(0);
  });
});

describe('pagerank', () => {
  it('satisfies the stationary equation solved directly with ml-matrix', () => {
    // x = alpha P^T x + (1 - alpha)/n (no dangling nodes on a connected graph): solve exactly.
    const graph = connectedGraph(21, 20);
    const { n } = graph;
    const a = adjacency(graph);
    const system = Matrix.eye(n);
    for (let u = 0; u < n; u++) {
      const degree = graph.offsets[u + 1]! - graph.offsets[u]!;
      for (let v = 0; v < n; v++) {
        if (a.get(u, v) === 1) system.set(v, u, system.get(v, u) - 0.85 / degree);
      }
    }
    const exact = solve(system, Matrix.columnVector(new Array(n).fill(0.15 / n))).getColumn(0);
    const ours = pagerank(graph, { tolerance: 1e-14, maxIterations: 1000 });
    exact.forEach((value, v) => expect(ours[v]).toBeCloseTo(value, 10));
  });
  it('spreads dangling mass uniformly, so scores sum to 1 on a directed graph with sinks', () => {
    const graph = csrFromEdges(['a', 'b', 'c', 'd'], [['a', 'b'], ['b', 'c'], ['a', 'c']], true);
    const scores = pagerank(graph);
    expect(scores.reduce((x, y) => x + y, 0)).toBeCloseTo(1, 12);
    expect(scores[2]!).toBeGreaterThan(scores[0]!);
  });
  it('rejects a damping factor outside [0, 1]', () => {
    expect(() => pagerank(connectedGraph(1, 5), { alpha: 1.5 })).toThrow(/alpha 1.5/);
  });
  it('throws ConvergenceError when the cap is too low', () => {
    expect(() => pagerank(connectedGraph(1, 50), { maxIterations: 1 })).toThrow(ConvergenceError);
  });
});

describe('degreeCentrality', () => {
  it('counts in- and out-arcs of a directed graph, as networkx does', () => {
    const graph = csrFromEdges(['a', 'b', 'c'], [['a', 'b'], ['c', 'a']], true);
    expect(Array.from(degreeCentrality(graph))).toEqual([1, 0.5, 0.5]);
  });
  it('scores 1 on a single-node graph', () => {
    expect(Array.from(degreeCentrality(csrFromEdges(['a'], [], false)))).toEqual([1]);
  });
});
