/**
 * One benchmark size, run inside its own child process by run.ts: generate the seeded network,
 * run the full analysis, read the peak RSS, then the two comparisons (one-at-a-time propagation
 * on a sample, graphology-metrics' betweenness where it finishes in reasonable time).
 */
import Graph from 'graphology';
import betweennessCentrality from 'graphology-metrics/centrality/betweenness';
import {
  analyse,
  betweenness,
  buildSupplyGraph,
  impactOf,
  type ClosenessMethod,
  type SupplyGraph,
} from '@keelson/supply-graph';
import { generateTieredNetwork } from '@keelson/supply-graph/testing';

/** What one size reports. */
export interface SizeResult {
  suppliers: number;
  nodes: number;
  edges: number;
  generateSeconds: number;
  /** Wall-clock seconds of `analyse()`: graph, tiers, all single removals, every measure. */
  analysisSeconds: number;
  /** CPU seconds of the same call (less sensitive to other load on the machine). */
  analysisCpuSeconds: number;
  stageSeconds: Record<string, number>;
  /** Peak RSS of the child process right after the analysis, in MB. */
  peakRssMb: number;
  /** How closeness was computed at this size (exact, or sampled with its precision). */
  closenessMethod: ClosenessMethod;
  oneAtATime: {
    /** Suppliers timed one at a time with impactOf (plain propagation), evenly spread. */
    sample: number;
    secondsPerSupplier: number;
    /** secondsPerSupplier x suppliers: an extrapolation, not a full run. */
    extrapolatedSeconds: number;
    /** extrapolatedSeconds / the bit-parallel stage's seconds. */
    speedUp: number;
  };
  graphology: {
    /** graphology-metrics all-pairs betweenness on the same directed graph; null when skipped. */
    seconds: number | null;
    /** Our all-pairs betweenness on the same graph (like for like). */
    ourAllPairsSeconds: number | null;
    /** graphology seconds / our subset betweenness stage seconds. */
    speedUpOfSubset: number | null;
    note: string;
  };
}

// graphology's all-pairs Brandes costs about nodes x edges steps; beyond this it runs for hours.
const GRAPHOLOGY_LIMIT = 5e8;

/** Measures one size (seed 20240601, 1% supplier cycles, 1% unsourced plant parts). */
export function measureSize(suppliers: number, sample: number): SizeResult {
  let started = performance.now();
  const model = generateTieredNetwork({
    seed: 20240601,
    suppliers,
    cycles: Math.round(suppliers / 100),
    unsourcedShare: 0.01,
  });
  const generateSeconds = (performance.now() - started) / 1000;
  global.gc?.();
  started = performance.now();
  const cpu = process.cpuUsage();
  const result = analyse(model);
  const analysisCpuSeconds = process.cpuUsage(cpu).user / 1e6;
  const analysisSeconds = (performance.now() - started) / 1000;
  const peakRssMb = process.resourceUsage().maxRSS / 1024;
  const stageSeconds = Object.fromEntries(
    Object.entries(result.timings).map(([stage, ms]) => [stage, ms / 1000]),
  );

  const graph = buildSupplyGraph(model);
  const oneAtATime = timeOneAtATime(graph, sample, stageSeconds['single removals']!);
  const graphology = timeGraphology(graph, stageSeconds['betweenness']!);
  return {
    suppliers,
    nodes: result.totals.nodes,
    edges: result.totals.edges,
    generateSeconds,
    analysisSeconds,
    closenessMethod: result.methods.closeness,
    analysisCpuSeconds,
    stageSeconds,
    peakRssMb,
    oneAtATime,
    graphology,
  };
}

function timeOneAtATime(graph: SupplyGraph, sample: number, bitParallelSeconds: number) {
  const count = Math.min(sample, graph.supplierCodes.length);
  const step = graph.supplierCodes.length / count;
  const started = performance.now();
  for (let i = 0; i < count; i++) impactOf(graph, [graph.supplierCodes[Math.floor(i * step)]!]);
  const secondsPerSupplier = (performance.now() - started) / 1000 / count;
  const extrapolatedSeconds = secondsPerSupplier * graph.supplierCodes.length;
  const speedUp = extrapolatedSeconds / bitParallelSeconds;
  return { sample: count, secondsPerSupplier, extrapolatedSeconds, speedUp };
}

function timeGraphology(graph: SupplyGraph, subsetSeconds: number): SizeResult['graphology'] {
  if (graph.n * graph.edgeCount > GRAPHOLOGY_LIMIT) {
    return {
      seconds: null,
      ourAllPairsSeconds: null,
      speedUpOfSubset: null,
      note:
        `skipped: nodes x edges = ${(graph.n * graph.edgeCount).toExponential(1)} > ` +
        GRAPHOLOGY_LIMIT.toExponential(0),
    };
  }
  const copy = new Graph({ type: 'directed' });
  for (const node of graph.nodes) copy.addNode(node.id);
  for (let u = 0; u < graph.n; u++) {
    for (let e = graph.offsets[u]!; e < graph.offsets[u + 1]!; e++) {
      copy.addEdge(graph.nodes[u]!.id, graph.nodes[graph.targets[e]!]!.id);
    }
  }
  let started = performance.now();
  betweennessCentrality(copy, { normalized: false });
  const seconds = (performance.now() - started) / 1000;
  started = performance.now();
  betweenness(graph, { normalized: false });
  const ourAllPairsSeconds = (performance.now() - started) / 1000;
  return {
    seconds,
    ourAllPairsSeconds,
    speedUpOfSubset: seconds / subsetSeconds,
    note: 'all-pairs Brandes (graphology) vs the subset betweenness the analysis computes',
  };
}
