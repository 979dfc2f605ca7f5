/**
 * Analysis runs and their results: the single-point-of-failure ranking, a supplier's risk page,
 * the heat map, the Pareto chart and scenarios. Result items use the field names of spec
 * section 6 (code, productsLost, revenueExposedPerWeek, revenueImpact, singlePointOfFailure,
 * betweenness, degree, closeness, eigenvector, pagerank) plus tier, nexusIndex and the register
 * score.
 */
import { z } from 'zod';

/** Where a run stands. */
export const RUN_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const;
/** One of {@link RUN_STATUSES}. */
export type RunStatus = (typeof RUN_STATUSES)[number];

/** The bands of the register rating, lowest first (spec 7: 1-4, 5-9, 10-16, 20-25). */
export const RATING_BANDS = ['low', 'medium', 'high', 'critical'] as const;
/** One of {@link RATING_BANDS}. */
export type RatingBand = (typeof RATING_BANDS)[number];

/** POST /api/analysis-runs body. */
export const startRunSchema = z.object({
  networkVersionId: z.number().int().positive(),
  label: z.string().trim().min(1).max(120),
});
/** POST /api/analysis-runs body. */
export type StartRunInput = z.infer<typeof startRunSchema>;

/** How closeness was computed in a run. */
export type ClosenessMethodDto =
  | { method: 'exact' }
  | { method: 'sampled'; pivots: number; seed: number; maxRelativeStandardError: number;
      medianRelativeStandardError: number };

/** GET /api/analysis-runs/:id answer (and each item of the run list). */
export interface AnalysisRunDto {
  id: number;
  networkVersionId: number;
  label: string;
  kind: 'manual' | 'quarterly';
  status: RunStatus;
  /** 0 - 1. */
  progress: number;
  /** The engine's stage while running ("single removals", "betweenness" ...). */
  stage: string | null;
  error: string | null;
  createdBy: { id: number; name: string } | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  /** Milliseconds per stage once finished. */
  timings: Record<string, number> | null;
  /** Suppliers, products, nodes, edges, total weekly revenue, single points of failure ... */
  totals: {
    suppliers: number;
    plants: number;
    products: number;
    nodes: number;
    edges: number;
    totalWeeklyRevenue: number;
    singlePointsOfFailure: number;
    productsDownAtBaseline: string[];
  } | null;
  methods: { closeness: ClosenessMethodDto } | null;
}

/** One server-sent event of GET /api/analysis-runs/:id/events (event name `progress`). */
export interface RunProgressEvent {
  id: number;
  status: RunStatus;
  progress: number;
  stage: string | null;
  error: string | null;
}

/** Time to survive and lost weeks of one lost product. */
export interface ProductImpactDto {
  code: string;
  plantCode: string;
  weeklyRevenue: number;
  /** Minimum weeks of cover over the down bought (item, plant) nodes of its BOM closure. */
  timeToSurvive: number;
  /** max(0, timeToRecover - timeToSurvive). */
  lostWeeks: number;
}

/** One supplier's row of a run: spec section 6 plus tier, nexus index and register score. */
export interface RunSupplierDto {
  rank: number;
  code: string;
  name: string;
  country: string;
  region: string;
  tier: number | null;
  productsLost: string[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  timeToRecover: number;
  singlePointOfFailure: boolean;
  betweenness: number;
  degree: number;
  closeness: number;
  eigenvector: number;
  pagerank: number;
  nexusIndex: number;
  /** Plants of the lost products. */
  plants: string[];
  /** Computed likelihood 1-5 (a register override does not change a run). */
  likelihood: number;
  likelihoodFactors: Record<string, number>;
  impactBand: number;
  rating: number;
  ratingBand: RatingBand;
}

/** Sort fields of the ranking. */
export const RUN_SUPPLIER_SORT_FIELDS = [
  'rank', 'code', 'name', 'tier', 'country', 'region', 'productsLost', 'revenueExposedPerWeek',
  'revenueImpact', 'timeToRecover', 'betweenness', 'degree', 'closeness', 'eigenvector',
  'pagerank', 'nexusIndex', 'likelihood', 'impactBand', 'rating',
] as const;

/** GET /api/analysis-runs/:id/suppliers query (limit up to 1000). */
export const listRunSuppliersQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(50),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  sort: z.enum(RUN_SUPPLIER_SORT_FIELDS).default('rank'),
  order: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(120).optional(),
  plant: z.string().trim().max(40).optional(),
  tier: z.coerce.number().int().min(1).max(50).optional(),
  country: z.string().trim().max(10).optional(),
  region: z.string().trim().max(60).optional(),
  ratingBand: z.enum(RATING_BANDS).optional(),
  /** Heat-map cell: likelihood and impact band together. */
  likelihood: z.coerce.number().int().min(1).max(5).optional(),
  impactBand: z.coerce.number().int().min(1).max(5).optional(),
  singlePointsOnly: z.enum(['true', 'false']).optional(),
});
/** GET /api/analysis-runs/:id/suppliers query. */
export type ListRunSuppliersQuery = z.infer<typeof listRunSuppliersQuerySchema>;

/** GET /api/analysis-runs/:id/heat-map answer: counts per (likelihood, impact band) cell. */
export interface HeatMapDto {
  /** cells[likelihood - 1][impactBand - 1] = number of suppliers. */
  cells: number[][];
  total: number;
}

/** GET /api/analysis-runs/:id/pareto answer: suppliers by revenue impact, with the running share. */
export interface ParetoDto {
  items: { code: string; name: string; revenueImpact: number; cumulativeShare: number }[];
  totalRevenueImpact: number;
}

/** A node of a failure path (supplier -> items -> ... -> product). */
export interface PathNodeDto {
  id: string;
  kind: 'plant' | 'product' | 'item' | 'supplier';
  code: string;
  /** The buyer of an item or the plant of a product; null otherwise. */
  buyer: string | null;
  /** Tier of a supplier node. */
  tier: number | null;
  /** Column for drawing: 0 at the product, counting up towards the supplier. */
  column: number;
}

/** GET /api/analysis-runs/:id/suppliers/:code answer: the row, its paths and its history. */
export interface RunSupplierDetailDto extends RunSupplierDto {
  runId: number;
  networkVersionId: number;
  products: ProductImpactDto[];
  /** One failure path per lost product, supplier first, product last. */
  failurePaths: { product: string; nodes: PathNodeDto[] }[];
  /** The supplier's scores in every succeeded run, oldest first. */
  history: { runId: number; label: string; finishedAt: string; revenueImpact: number;
    rating: number; likelihood: number; impactBand: number; nexusIndex: number }[];
  /** Its register entry, if there is one. */
  registerEntryId: number | null;
}

/** A failure set: suppliers by code, every supplier of some countries or regions. */
export const failureSetSchema = z.object({
  suppliers: z.array(z.string().trim().min(1).max(60)).max(5000).default([]),
  countries: z.array(z.string().trim().min(1).max(10)).max(300).default([]),
  regions: z.array(z.string().trim().min(1).max(60)).max(100).default([]),
});
/** A failure set. */
export type FailureSet = z.infer<typeof failureSetSchema>;

/** POST /api/network-versions/:id/scenario body: evaluate a failure set on a version. */
export const evaluateScenarioSchema = failureSetSchema;

/** The impact of a failure set on a network version. */
export interface ScenarioResultDto {
  networkVersionId: number;
  failed: string[];
  productsLost: string[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  timeToRecover: number;
  products: ProductImpactDto[];
  /** One failure path per lost product, from one of the failed suppliers. */
  failurePaths: { product: string; nodes: PathNodeDto[] }[];
}

/** POST /api/scenarios body (a saved failure set). */
export const saveScenarioSchema = failureSetSchema.extend({
  name: z.string().trim().min(1).max(120),
  description: z.string().trim().max(2000).optional(),
});
/** POST /api/scenarios body. */
export type SaveScenarioInput = z.infer<typeof saveScenarioSchema>;

/** A saved scenario. */
export interface ScenarioDto extends FailureSet {
  id: number;
  name: string;
  description: string | null;
  createdBy: { id: number; name: string } | null;
  createdAt: string;
  updatedAt: string;
}

/** GET /api/analysis-runs query: a page of runs, newest first, optionally of one version. */
export const listRunsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(20),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  networkVersionId: z.coerce.number().int().positive().optional(),
});
/** GET /api/analysis-runs query. */
export type ListRunsQuery = z.infer<typeof listRunsQuerySchema>;

/** Error code of GET /api/analysis-runs/:id/... results when the run has not succeeded. */
export const RUN_NOT_READY = 'run_not_ready';
