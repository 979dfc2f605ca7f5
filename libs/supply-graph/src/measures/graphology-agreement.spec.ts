/**
 * Agreement with graphology 0.26 + graphology-metrics 2.4.2 (an independent implementation, dev
 * dependency) on seeded random graphs, where the definitions agree:
 * - betweenness: graphology's `{normalized: false}` is Brandes with networkx's halving on
 *   undirected graphs, as ours; normalised both divide by (n-1)(n-2);
 * - closeness: graphology's `{wassermanFaust: true}` is (r-1)/D x (r-1)/(n-1) over inbound
 *   distances, as ours (networkx's definition);
 * - eigenvector and PageRank: graphology runs the same power iterations from 1/n with the same
 *   stopping rule (L1 change < n x 1e-6), so only floating-point summation order differs and
 *   1e-9 is a fair tolerance. Its default iteration cap for eigenvector is 100; we raise it to
 *   ours (10 000) so that slow graphs do not throw there first.
 */
import Graph from 'graphology';
import betweennessCentrality from 'graphology-metrics/centrality/betweenness';
import closenessCentralityOfGraphology from 'graphology-metrics/centrality/closeness';
import eigenvectorOfGraphology from 'graphology-metrics/centrality/eigenvector';
import pagerankOfGraphology from 'graphology-metrics/centrality/pagerank';
import { describe, expect, it } from 'vitest';
import { csrFromEdges, type NamedCsrGraph } from '../csr-graph';
import { mulberry32 } from '../testing/mulberry32';
import { betweenness } from './betweenness';
import { closenessCentrality } from './closeness';
import { eigenvectorCentrality } from './eigenvector';
import { pagerank } from './pagerank';

interface Pair {
  ours: NamedCsrGraph<string>;
  theirs: Graph;
}

/** A seeded random simple graph with a few isolated nodes and small side components. */
function randomGraph(seed: number, directed: boolean): Pair {
  const random = mulberry32(seed);
  const n = 40 + Math.floor(random() * 40);
  const nodes = Array.from({ length: n }, (_, i) => `n${i}`);
  const keys = new Set<string>();
  const edges: Array<readonly [string, string]> = [];
  const wanted = Math.floor(n * (1.2 + random()));
  while (edges.length < wanted) {
    // Nodes 0..n-4 form the main part; the last three only link among themselves or not at all.
    const limit = random() < 0.95 ? n - 3 : n;
    const u = Math.floor(random() * limit);
    const v = Math.floor(random() * limit);
    const key = directed ? `${u}>${v}` : `${Math.min(u, v)}-${Math.max(u, v)}`;
    if (u === v || keys.has(key)) continue;
    keys.add(key);
    edges.push([nodes[u]!, nodes[v]!]);
  }
  const theirs = new Graph({ type: directed ? 'directed' : 'undirected' });
  for (const node of nodes) theirs.addNode(node);
  for (const [u, v] of edges) theirs.addEdge(u, v);
  return { ours: csrFromEdges(nodes, edges, directed), theirs };
}

function expectSame(
  pair: Pair,
  ours: Float64Array,
  theirs: Record<string, number>,
  tolerance: number,
): void {
  for (const [id, value] of Object.entries(theirs)) {
    const actual = ours[pair.ours.indexOf.get(id)!]!;
    if (Math.abs(actual - value) > tolerance) {
      throw new Error(`${id}: ours ${actual}, graphology ${value}`);
    }
  }
  expect(Object.keys(theirs)).toHaveLength(pair.ours.n);
}

const SEEDS = [1, 2, 3, 4, 5, 6];

describe.each(SEEDS)('graphology-metrics on random graph seed %i', (seed) => {
  const undirected = randomGraph(seed, false);
  const directed = randomGraph(seed + 100, true);

  it('raw betweenness agrees (undirected and directed)', () => {
    for (const pair of [undirected, directed]) {
      const theirs = betweennessCentrality(pair.theirs, { normalized: false });
      expectSame(pair, betweenness(pair.ours, { normalized: false }), theirs, 1e-9);
    }
  });
  it('normalised betweenness agrees', () => {
    for (const pair of [undirected, directed]) {
      expectSame(pair, betweenness(pair.ours), betweennessCentrality(pair.theirs), 1e-12);
    }
  });
  it('Wasserman-Faust closeness agrees (undirected and directed, inbound distances)', () => {
    for (const pair of [undirected, directed]) {
      const theirs = closenessCentralityOfGraphology(pair.theirs, { wassermanFaust: true });
      expectSame(pair, closenessCentrality(pair.ours), theirs, 1e-12);
    }
  });
  it('eigenvector centrality agrees on the undirected graph', () => {
    const theirs = eigenvectorOfGraphology(undirected.theirs, { maxIterations: 10_000 });
    expectSame(undirected, eigenvectorCentrality(undirected.ours), theirs, 1e-9);
  });
  it('PageRank agrees (undirected and directed)', () => {
    for (const pair of [undirected, directed]) {
      expectSame(pair, pagerank(pair.ours), pagerankOfGraphology(pair.theirs), 1e-9);
    }
  });
});
