/**
 * The pivot estimate of closeness against the exact search: exact where every node of a
 * component is a pivot, close (within a few reported standard errors) on seeded tiered networks,
 * reproducible for a seed.
 */
import { describe, expect, it } from 'vitest';
import { buildSupplyGraph } from '../build-supply-graph';
import { csrFromArrays } from '../csr-graph';
import { generateTieredNetwork } from '../testing/generate-tiered-network';
import { closenessCentrality } from './closeness';
import { sampledCloseness } from './closeness-sampled';
import { undirectedView } from './undirected-view';

describe('sampledCloseness', () => {
  it('is exact when the pivots cover every node (path a-b-c-d plus the edge e-f)', () => {
    // By hand: on the path, node b has distances 1, 1, 2 -> (3/4) x (3/5) = 0.45;
    // e has one neighbour -> (1/1) x (1/5) = 0.2.
    const graph = csrFromArrays(6, Int32Array.from([0, 1, 2, 4]), Int32Array.from([1, 2, 3, 5]),
      false);
    const { scores, maxRelativeStandardError } = sampledCloseness(graph, { pivots: 6 });
    expect(scores[1]).toBeCloseTo(0.45, 12);
    expect(scores[4]).toBeCloseTo(0.2, 12);
    expect(Array.from(scores)).toEqual(Array.from(closenessCentrality(graph)));
    expect(maxRelativeStandardError).toBe(0);
  });

  it('stays within five reported standard errors of the exact values on a tiered network', () => {
    const graph = buildSupplyGraph(generateTieredNetwork({ seed: 11, suppliers: 400, cycles: 3 }));
    const undirected = undirectedView(graph);
    const exact = closenessCentrality(undirected, { nodes: graph.supplierNodes });
    const estimate = sampledCloseness(undirected, { nodes: graph.supplierNodes, pivots: 300 });
    expect(estimate.pivots).toBeGreaterThanOrEqual(295);
    expect(estimate.maxRelativeStandardError).toBeGreaterThan(0);
    expect(estimate.maxRelativeStandardError).toBeLessThan(0.05);
    for (const v of graph.supplierNodes) {
      const relative = Math.abs(estimate.scores[v]! - exact[v]!) / exact[v]!;
      // 1/D has the same relative error as D to first order; allow 5 of the largest errors.
      expect(relative).toBeLessThan(5 * estimate.maxRelativeStandardError);
    }
  });

  it('gives the same values for the same seed and other values for another', () => {
    const graph = undirectedView(buildSupplyGraph(generateTieredNetwork({ seed: 3,
      suppliers: 200 })));
    const a = sampledCloseness(graph, { pivots: 50, seed: 1 });
    const b = sampledCloseness(graph, { pivots: 50, seed: 1 });
    const c = sampledCloseness(graph, { pivots: 50, seed: 2 });
    expect(Array.from(a.scores)).toEqual(Array.from(b.scores));
    expect(Array.from(a.scores)).not.toEqual(Array.from(c.scores));
  });

  it('refuses a directed graph and an index that is not a node', () => {
    const directed = csrFromArrays(2, Int32Array.from([0]), Int32Array.from([1]), true);
    expect(() => sampledCloseness(directed)).toThrow(/must be undirected/);
    const graph = csrFromArrays(2, Int32Array.from([0]), Int32Array.from([1]), false);
    expect(() => sampledCloseness(graph, { nodes: [7] })).toThrow(/node 7 is not a node index/);
  });
});
