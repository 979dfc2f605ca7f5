/**
 * `@keelson/supply-graph`: the analysis engine. A typed supply model in; the supply graph, tiers,
 * failure propagation, impact (time to survive / time to recover), every single-supplier removal
 * at once, network measures, the nexus supplier index, failure paths and one `analyse()` out.
 * Pure: no Node built-ins, no frameworks, so it runs in the API, a worker, the command line and a
 * browser alike. The contract is shared/spec/supply-model.md; the methods are in docs/methods.md.
 */
export { analyse, CLOSENESS_EXACT_WORK_LIMIT, type AnalyseOptions } from './analyse';
export type {
  AnalysisResult,
  AnalysisStage,
  AnalysisTimings,
  AnalysisTotals,
  ClosenessMethod,
  ScenarioResult,
  SupplierResult,
} from './analysis-result';
export {
  allSingleImpacts,
  type SingleImpact,
  type SingleImpactOptions,
} from './all-single-impacts';
export { buildSupplyGraph } from './build-supply-graph';
export { compareCodePoints } from './code-order';
export { condense, type Condensation } from './condensation';
export {
  csrFromArrays,
  csrFromEdges,
  edgeCount,
  reverseCsr,
  undirectedCsr,
  type CsrGraph,
  type NamedCsrGraph,
} from './csr-graph';
export {
  AnalysisCancelledError,
  ConvergenceError,
  UnknownSupplierError,
  type CancellationSignal,
  type ProgressOptions,
} from './errors';
export { failurePaths, type FailurePath, type PathNode } from './failure-paths';
export { impactOf, type Impact, type ProductImpact } from './impact';
export { BETWEENNESS_DEFAULTS, betweenness, type BetweennessOptions } from './measures/betweenness';
export {
  BETWEENNESS_SUBSET_DEFAULTS,
  betweennessSubset,
  type BetweennessSubsetOptions,
} from './measures/betweenness-subset';
export {
  CLOSENESS_DEFAULTS,
  closenessCentrality,
  type ClosenessOptions,
} from './measures/closeness';
export {
  SAMPLED_CLOSENESS_DEFAULTS,
  sampledCloseness,
  type SampledCloseness,
  type SampledClosenessOptions,
} from './measures/closeness-sampled';
export { DEGREE_DEFAULTS, degreeCentrality, type DegreeOptions } from './measures/degree';
export {
  EIGENVECTOR_DEFAULTS,
  eigenvectorCentrality,
  type EigenvectorOptions,
} from './measures/eigenvector';
export {
  NEXUS_DEFAULTS,
  nexusSupplierIndex,
  type NexusMeasures,
  type NexusOptions,
} from './measures/nexus-supplier-index';
export { PAGERANK_DEFAULTS, pagerank, type PagerankOptions } from './measures/pagerank';
export { undirectedView } from './measures/undirected-view';
export { propagateFailure } from './propagate-failure';
export {
  NODE_KIND,
  NODE_RULE,
  itemId,
  plantId,
  productId,
  supplierId,
  type SupplyGraph,
  type SupplyNodeData,
  type SupplyNodeKind,
} from './supply-graph';
export { tiers } from './tiers';
