/**
 * The JSON of an analysis (spec section 6), shared by the command-line analyser and the API's
 * run results. Numbers are plain JSON numbers; money is not rounded.
 */
import type { ProductImpact } from './impact';

/** One supplier's row: its own removal, its tier and its network measures. */
export interface SupplierResult {
  code: string;
  name: string;
  country: string;
  region: string;
  /** 1 sells to a plant; k + 1 sells to a tier-k supplier; null: no plant depends on it. */
  tier: number | null;
  /** Products lost when this supplier alone fails, sorted by code. */
  productsLost: string[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  /** Its recovery weeks: the time to recover of its own failure. */
  timeToRecover: number;
  /** Its removal alone loses at least one product. */
  singlePointOfFailure: boolean;
  /** Subset betweenness, raw-material suppliers to products (unnormalised). */
  betweenness: number;
  /** Degree centrality on the undirected graph. */
  degree: number;
  /** Closeness (Wasserman-Faust) on the undirected graph. */
  closeness: number;
  /** Eigenvector centrality on the undirected graph (unit Euclidean norm over all nodes). */
  eigenvector: number;
  /** PageRank on the undirected graph (sums to 1 over all nodes). */
  pagerank: number;
  /** Nexus supplier index in [0, 1] (our operationalisation; docs/methods.md). */
  nexusIndex: number;
  /** Time to survive and lost weeks per lost product, in the order of `productsLost`. */
  products: ProductImpact[];
}

/** The failure set named by `fail` / `failCountry`, and its impact. */
export interface ScenarioResult {
  /** Failed suppliers, sorted by code, without repeats. */
  failed: string[];
  productsLost: string[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  timeToRecover: number;
  products: ProductImpact[];
}

/** Sizes and sums of the analysed network. */
export interface AnalysisTotals {
  suppliers: number;
  plants: number;
  products: number;
  nodes: number;
  edges: number;
  /** Sum of the weekly revenue of all products. */
  totalWeeklyRevenue: number;
  /** Suppliers whose removal alone loses at least one product. */
  singlePointsOfFailure: number;
  /** Products already down with no failure (through an unsourced item), sorted by code. */
  productsDownAtBaseline: string[];
}

/** Milliseconds per stage of the analysis. */
export type AnalysisTimings = Record<AnalysisStage | 'total', number>;

/** The stages of `analyse`, in order, as reported to `onProgress`. */
export type AnalysisStage =
  | 'graph'
  | 'tiers'
  | 'single removals'
  | 'betweenness'
  | 'closeness'
  | 'degree'
  | 'eigenvector'
  | 'pagerank'
  | 'nexus index'
  | 'scenario';

/** How closeness was computed: exactly, or estimated from pivots with its precision. */
export type ClosenessMethod =
  | { method: 'exact' }
  | {
      method: 'sampled';
      pivots: number;
      seed: number;
      /** Largest and median relative standard error of the suppliers' distance sums. */
      maxRelativeStandardError: number;
      medianRelativeStandardError: number;
    };

/** The analysis of one network. */
export interface AnalysisResult {
  /** Every supplier, sorted by code (code-point order). */
  suppliers: SupplierResult[];
  /** Present when a failure set was named. */
  scenario?: ScenarioResult;
  totals: AnalysisTotals;
  timings: AnalysisTimings;
  /** Methods chosen for this network (only closeness has a choice). */
  methods: { closeness: ClosenessMethod };
}
