/**
 * The undirected, unweighted version of a graph, computed once per graph object and cached, so
 * that degree, closeness, eigenvector, PageRank and the nexus index share one copy.
 */
import { undirectedCsr, type CsrGraph } from '../csr-graph';

const views = new WeakMap<CsrGraph, CsrGraph>();

/** The undirected version of `graph` (the graph itself when already undirected). */
export function undirectedView(graph: CsrGraph): CsrGraph {
  if (!graph.directed) return graph;
  let view = views.get(graph);
  if (!view) {
    view = undirectedCsr(graph);
    views.set(graph, view);
  }
  return view;
}
