/**
 * The one entry point of the engine: a supply model in, the JSON of spec section 6 out. Builds
 * the graph, computes tiers, every single-supplier removal (bit-parallel), the network measures
 * and the nexus index, and the scenario when a failure set is named. Reports progress from 0 to 1
 * over the stages and stops between chunks of work when the signal is aborted.
 */
import type { SupplyModel } from '@keelson/contracts';
import { allSingleImpacts } from './all-single-impacts';
import type {
  AnalysisResult,
  AnalysisStage,
  AnalysisTimings,
  ClosenessMethod,
  ScenarioResult,
  SupplierResult,
} from './analysis-result';
import { buildSupplyGraph } from './build-supply-graph';
import { sortedUniqueCodes } from './code-order';
import { throwIfCancelled, type CancellationSignal } from './errors';
import { impactOf } from './impact';
import { betweennessSubset } from './measures/betweenness-subset';
import { closenessCentrality } from './measures/closeness';
import { sampledCloseness } from './measures/closeness-sampled';
import { degreeCentrality } from './measures/degree';
import { eigenvectorCentrality } from './measures/eigenvector';
import { nexusSupplierIndex } from './measures/nexus-supplier-index';
import { pagerank } from './measures/pagerank';
import { undirectedView } from './measures/undirected-view';
import { supplierNodesFor } from './propagate-failure';
import type { CsrGraph } from './csr-graph';
import type { SupplyGraph } from './supply-graph';
import { tierArray } from './tiers';

/** Options of {@link analyse}. */
export interface AnalyseOptions {
  /** Supplier codes that fail together in the scenario. */
  fail?: readonly string[];
  /** Every supplier of this country fails too (trimmed, case-insensitive match). */
  failCountry?: string;
  /** Called with the overall fraction done (0 to 1) and the current stage. */
  onProgress?: (fraction: number, stage: AnalysisStage) => void;
  /** Checked between chunks; when aborted, `AnalysisCancelledError` is thrown. */
  signal?: CancellationSignal;
  /**
   * How closeness is computed: `exact` (every supplier searched), `sampled` (pivot estimate,
   * see closeness-sampled.ts) or `auto` (default): exact while suppliers x (nodes + adjacency
   * entries) stays within {@link CLOSENESS_EXACT_WORK_LIMIT}, sampled above.
   */
  closeness?: 'auto' | 'exact' | 'sampled';
}

/**
 * Work bound of exact closeness under `closeness: 'auto'`: suppliers x (nodes + adjacency
 * entries). 6e9 keeps every network up to about 12 000 suppliers at 20 edges per supplier exact
 * (the 10 000-supplier benchmark network is 4.9e9) and the analysis within seconds above it.
 */
export const CLOSENESS_EXACT_WORK_LIMIT = 6e9;

// Share of the progress bar per stage, roughly their share of the running time.
const STAGE_WEIGHTS: Record<AnalysisStage, number> = {
  graph: 0.1,
  tiers: 0.01,
  'single removals': 0.3,
  betweenness: 0.2,
  closeness: 0.25,
  degree: 0.01,
  eigenvector: 0.07,
  pagerank: 0.04,
  'nexus index': 0.01,
  scenario: 0.01,
};
const STAGES = Object.keys(STAGE_WEIGHTS) as AnalysisStage[];

/**
 * Analyses a supply model. Throws `UnknownSupplierError` (listing the codes) when `fail` names a
 * code that is not a supplier, before any heavy work; `AnalysisCancelledError` when cancelled;
 * `ConvergenceError` if eigenvector centrality fails to converge.
 */
export function analyse(model: SupplyModel, options: AnalyseOptions = {}): AnalysisResult {
  const started = performance.now();
  const timings = Object.fromEntries([...STAGES, 'total'].map((s) => [s, 0])) as AnalysisTimings;
  let done = 0;
  const run = <T>(stage: AnalysisStage, work: (progress: (f: number) => void) => T): T => {
    throwIfCancelled(options.signal, stage);
    const weight = STAGE_WEIGHTS[stage];
    options.onProgress?.(done, stage);
    const t0 = performance.now();
    const result = work((f) =>
      options.onProgress?.(done + weight * Math.min(1, Math.max(0, f)), stage),
    );
    timings[stage] = performance.now() - t0;
    done += weight;
    return result;
  };
  const signal = options.signal;

  const graph = run('graph', () => buildSupplyGraph(model));
  const failed = scenarioCodes(graph, options);
  const tier = run('tiers', () => tierArray(graph));
  const impacts = run('single removals', (onProgress) =>
    allSingleImpacts(graph, { onProgress, signal }),
  );
  const betweenness = run('betweenness', (onProgress) =>
    betweennessSubset(graph, { onProgress, signal }),
  );
  const undirected = undirectedView(graph);
  const { closeness, method: closenessMethod } = run('closeness', (onProgress) =>
    closenessOf(undirected, graph.supplierNodes, options.closeness ?? 'auto', onProgress, signal),
  );
  const degree = run('degree', () => degreeCentrality(undirected));
  const eigenvector = run('eigenvector', () => eigenvectorCentrality(undirected, { signal }));
  const rank = run('pagerank', () => pagerank(undirected, { signal }));
  const nexus = run('nexus index', () =>
    nexusSupplierIndex(graph, { measures: { degree, betweenness, closeness, eigenvector } }),
  );
  const scenario = run('scenario', () => (failed ? scenarioOf(graph, failed) : undefined));

  const suppliers = graph.supplierRecords.map((record, ordinal): SupplierResult => {
    const node = graph.supplierNodes[ordinal]!;
    const impact = impacts[ordinal]!;
    return {
      code: record.code,
      name: record.name,
      country: record.country,
      region: record.region,
      tier: tier[ordinal] || null,
      productsLost: impact.productsLost,
      revenueExposedPerWeek: impact.revenueExposedPerWeek,
      revenueImpact: impact.revenueImpact,
      timeToRecover: impact.timeToRecover,
      singlePointOfFailure: impact.productsLost.length > 0,
      betweenness: betweenness[node]!,
      degree: degree[node]!,
      closeness: closeness[node]!,
      eigenvector: eigenvector[node]!,
      pagerank: rank[node]!,
      nexusIndex: nexus.get(record.code)!,
      products: impact.products,
    };
  });
  let totalWeeklyRevenue = 0;
  for (const revenue of graph.weeklyRevenue) totalWeeklyRevenue += revenue;
  timings.total = performance.now() - started;
  options.onProgress?.(1, 'scenario');
  return {
    suppliers,
    ...(scenario ? { scenario } : {}),
    totals: {
      suppliers: graph.supplierCodes.length,
      plants: graph.plantCodes.length,
      products: graph.productCodes.length,
      nodes: graph.n,
      edges: graph.edgeCount,
      totalWeeklyRevenue,
      singlePointsOfFailure: suppliers.filter((s) => s.singlePointOfFailure).length,
      productsDownAtBaseline: graph.productCodes.filter(
        (_, p) => graph.baselineDown[graph.productNodes[p]!] === 1,
      ),
    },
    timings,
    methods: { closeness: closenessMethod },
  };
}

/** Exact or sampled closeness of the suppliers, as `mode` and the work bound say. */
function closenessOf(
  undirected: CsrGraph,
  nodes: Int32Array,
  mode: 'auto' | 'exact' | 'sampled',
  onProgress: (fraction: number) => void,
  signal: CancellationSignal | undefined,
): { closeness: Float64Array; method: ClosenessMethod } {
  const work = nodes.length * (undirected.n + undirected.targets.length);
  if (mode === 'exact' || (mode === 'auto' && work <= CLOSENESS_EXACT_WORK_LIMIT)) {
    const closeness = closenessCentrality(undirected, { nodes, onProgress, signal });
    return { closeness, method: { method: 'exact' } };
  }
  const estimate = sampledCloseness(undirected, { nodes, onProgress, signal });
  return {
    closeness: estimate.scores,
    method: {
      method: 'sampled',
      pivots: estimate.pivots,
      seed: estimate.seed,
      maxRelativeStandardError: estimate.maxRelativeStandardError,
      medianRelativeStandardError: estimate.medianRelativeStandardError,
    },
  };
}

/**
 * The scenario's failure set: `fail` (checked: unknown codes throw `UnknownSupplierError`) plus
 * every supplier whose trimmed country equals the trimmed `failCountry`, ignoring case.
 * Undefined when neither option is given.
 */
function scenarioCodes(graph: SupplyGraph, options: AnalyseOptions): string[] | undefined {
  if (options.fail === undefined && options.failCountry === undefined) return undefined;
  const codes = [...(options.fail ?? [])];
  supplierNodesFor(graph, codes);
  if (options.failCountry !== undefined) {
    const country = normaliseCountry(options.failCountry);
    for (const supplier of graph.supplierRecords) {
      if (country !== '' && normaliseCountry(supplier.country) === country) {
        codes.push(supplier.code);
      }
    }
  }
  return sortedUniqueCodes(codes);
}

function normaliseCountry(country: string): string {
  return country.trim().toLowerCase();
}

function scenarioOf(graph: SupplyGraph, failed: string[]): ScenarioResult {
  const impact = impactOf(graph, failed);
  return {
    failed: impact.failed,
    productsLost: impact.productsLost,
    revenueExposedPerWeek: impact.revenueExposedPerWeek,
    revenueImpact: impact.revenueImpact,
    timeToRecover: impact.timeToRecover,
    products: impact.products,
  };
}
