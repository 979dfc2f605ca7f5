/**
 * Measures against networkx 3.6.1 on published datasets, from shared/reference/*.json (see its
 * README): Zachary's karate club (Zachary 1977), the Florentine families' marriages (Padgett and
 * Ansell 1993) and Davis's southern women (Davis, Gardner and Gardner 1941), plus a hand-drawn
 * DAG for betweenness_centrality_subset. Our iterations copy networkx's, so plain values agree
 * to 1e-9.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { csrFromEdges, type NamedCsrGraph } from '../csr-graph';
import { betweenness } from './betweenness';
import { betweennessSubset } from './betweenness-subset';
import { closenessCentrality } from './closeness';
import { degreeCentrality } from './degree';
import { eigenvectorCentrality } from './eigenvector';
import { pagerank } from './pagerank';

const referenceDir =
  process.env['KEELSON_REFERENCE_DIR'] ??
  join(import.meta.dirname, '..', '..', '..', '..', '..', 'shared', 'reference');

interface ReferenceFile {
  source: string;
  directed: boolean;
  nodes: Array<string | number>;
  edges: Array<[string | number, string | number]>;
  sources?: string[];
  targets?: string[];
  expected: Record<string, Record<string, number>>;
}

function load(name: string): { file: ReferenceFile; graph: NamedCsrGraph<string> } {
  const file = JSON.parse(readFileSync(join(referenceDir, name), 'utf8')) as ReferenceFile;
  const nodes = file.nodes.map(String);
  const edges = file.edges.map(([u, v]) => [String(u), String(v)] as const);
  return { file, graph: csrFromEdges(nodes, edges, file.directed) };
}

function expectScores(
  graph: NamedCsrGraph<string>,
  scores: Float64Array,
  expected: Record<string, number>,
  tolerance = 1e-9,
): void {
  expect(Object.keys(expected).sort()).toEqual([...graph.ids].sort());
  for (const [id, value] of Object.entries(expected)) {
    const actual = scores[graph.indexOf.get(id)!]!;
    if (Math.abs(actual - value) > tolerance) {
      throw new Error(`node ${id}: expected ${value}, got ${actual} (tolerance ${tolerance})`);
    }
  }
}

describe.each(['karate.json', 'florentine.json', 'davis.json'])('networkx reference %s', (name) => {
  const { file, graph } = load(name);

  it('has the published size', () => {
    expect(graph.n).toBe(file.nodes.length);
    expect(graph.targets.length).toBe(2 * file.edges.length);
  });
  it('degree centrality equals nx.degree_centrality', () => {
    expectScores(graph, degreeCentrality(graph), file.expected['degree_centrality']!);
  });
  it('closeness equals nx.closeness_centrality (Wasserman-Faust)', () => {
    expectScores(graph, closenessCentrality(graph), file.expected['closeness_centrality']!);
  });
  it('closeness of a node subset equals the full computation for those nodes', () => {
    const nodes = Int32Array.from([3, 0, graph.n - 1]);
    const subset = closenessCentrality(graph, { nodes, wordsPerPass: 1 });
    const full = closenessCentrality(graph);
    for (const v of nodes) expect(subset[v]).toBe(full[v]);
    expect(Number.isNaN(subset[1]!)).toBe(true);
  });
  it('raw betweenness equals nx.betweenness_centrality(normalized=False)', () => {
    expectScores(
      graph,
      betweenness(graph, { normalized: false }),
      file.expected['betweenness_centrality_unnormalized']!,
    );
  });
  it('normalised betweenness equals nx.betweenness_centrality(normalized=True)', () => {
    expectScores(graph, betweenness(graph), file.expected['betweenness_centrality_normalized']!);
  });
  it('eigenvector centrality equals nx.eigenvector_centrality (tol 1e-6)', () => {
    expectScores(graph, eigenvectorCentrality(graph), file.expected['eigenvector_centrality']!);
  });
  it('PageRank equals nx.pagerank (alpha 0.85, tol 1e-6)', () => {
    expectScores(graph, pagerank(graph), file.expected['pagerank']!);
  });
  it('differs from the converged networkx values only by the stopping tolerance', () => {
    // The *_converged twins iterate to 1e-15; the README gives up to 8e-6 between the two.
    expectScores(graph, pagerank(graph), file.expected['pagerank_converged']!, 1e-5);
    expectScores(
      graph,
      eigenvectorCentrality(graph),
      file.expected['eigenvector_centrality_converged']!,
      1e-5,
    );
  });
});

describe('networkx reference subset_dag.json (betweenness_centrality_subset)', () => {
  const { file, graph } = load('subset_dag.json');
  const sources = Int32Array.from(file.sources!, (id) => graph.indexOf.get(id)!);
  const targets = Int32Array.from(file.targets!, (id) => graph.indexOf.get(id)!);
  const expected = file.expected['betweenness_centrality_subset']!;

  it('equals networkx from the sources, unhalved on a directed graph', () => {
    expectScores(graph, betweennessSubset(graph, { sources, targets }), expected);
  });
  it('equals a brute-force count when searching from fewer targets (reversed graph)', () => {
    // One target and two sources: the search starts at the target on the reversed graph.
    const one = Int32Array.from(targets.slice(0, 1));
    const scores = betweennessSubset(graph, { sources, targets: one });
    expect(Array.from(scores)).toEqual(
      bruteForceSubset(graph, sources, one).map((value) => expect.closeTo(value, 12)),
    );
    // Hand count of the README: B lies on 7/3 of the S->T shortest paths (both targets).
    expect(betweennessSubset(graph, { sources, targets })[graph.indexOf.get('B')!]).toBeCloseTo(
      7 / 3,
      12,
    );
  });
  it('is halved on an undirected graph, as networkx halves undirected subset betweenness', () => {
    const edges = file.edges.map(([u, v]) => [String(u), String(v)] as const);
    const undirected = csrFromEdges(graph.ids, edges, false);
    const scores = betweennessSubset(undirected, { sources, targets });
    const brute = bruteForceSubset(undirected, sources, targets).map((value) => value / 2);
    expect(Array.from(scores)).toEqual(brute.map((value) => expect.closeTo(value, 12)));
  });
  it('rejects an index that is not a node', () => {
    expect(() => betweennessSubset(graph, { sources: [99], targets })).toThrow(/sources\[0\] = 99/);
  });
  it('asks for sources and targets on a plain graph', () => {
    expect(() => betweennessSubset(graph)).toThrow(/give sources and targets/);
  });
});

/**
 * Independent check (written for this test): sum over s in S, t in T of sigma_st(v) / sigma_st
 * with sigma_st(v) = sigma_sv x sigma_vt when d(s, v) + d(v, t) = d(s, t), from all-pairs BFS.
 */
function bruteForceSubset(
  graph: NamedCsrGraph<string>,
  sources: ArrayLike<number>,
  targets: ArrayLike<number>,
): number[] {
  const { n, offsets, targets: adjacency } = graph;
  const distance: number[][] = [];
  const sigma: number[][] = [];
  for (let s = 0; s < n; s++) {
    const d = new Array<number>(n).fill(-1);
    const c = new Array<number>(n).fill(0);
    d[s] = 0;
    c[s] = 1;
    const queue = [s];
    for (let head = 0; head < queue.length; head++) {
      const v = queue[head]!;
      for (let e = offsets[v]!; e < offsets[v + 1]!; e++) {
        const w = adjacency[e]!;
        if (d[w] === -1) {
          d[w] = d[v]! + 1;
          queue.push(w);
        }
        if (d[w] === d[v]! + 1) c[w]! += c[v]!;
      }
    }
    distance.push(d);
    sigma.push(c);
  }
  const scores = new Array<number>(n).fill(0);
  for (const s of Array.from(sources)) {
    for (const t of Array.from(targets)) {
      if (s === t || distance[s]![t]! < 0) continue;
      for (let v = 0; v < n; v++) {
        if (v === s || v === t || distance[s]![v]! < 0 || distance[v]![t]! < 0) continue;
        if (distance[s]![v]! + distance[v]![t]! === distance[s]![t]!) {
          scores[v]! += (sigma[s]![v]! * sigma[v]![t]!) / sigma[s]![t]!;
        }
      }
    }
  }
  return scores;
}
