import type { AnalysisRunDto, PathNodeDto, RunSupplierDetailDto } from '@keelson/contracts';
import type { NetworkPicture } from './network-picture-dto';

/**
 * Answers of the runs and picture API for the risk screens' specs, shaped like the DTOs in
 * libs/contracts/src/runs.ts and the picture DTO. Invented companies and codes in the demo's
 * naming pattern; the figures are made up to be easy to check by eye.
 */

function pathNode(kind: PathNodeDto['kind'], code: string, column: number,
  extra: Partial<PathNodeDto> = {}): PathNodeDto {
  const id = kind === 'item' ? `item:${code}@${extra.buyer}` : `${kind}:${code}`;
  return { id, kind, code, buyer: null, tier: null, column, ...extra };
}

const SUPPLIER = pathNode('supplier', 'S-2-SHARED-A', 4, { tier: 2 });
const CASTING = pathNode('item', 'C-77', 3, { buyer: 'S-1-004' });
const TIER_ONE = pathNode('supplier', 'S-1-004', 2, { tier: 1 });

/**
 * Two failure paths from one supplier: to F-100 through a tier-1 supplier and its part, and to
 * F-200 through the same two nodes and one more part. Distinct nodes: the supplier, C-77 at
 * S-1-004, S-1-004, H-10 at P-NORTH, F-100, H-20 at P-NORTH, F-200 (7). Distinct hops: 6.
 */
export const FAILURE_PATHS: RunSupplierDetailDto['failurePaths'] = [
  {
    product: 'F-100',
    nodes: [SUPPLIER, CASTING, TIER_ONE, pathNode('item', 'H-10', 1, { buyer: 'P-NORTH' }),
      pathNode('product', 'F-100', 0, { buyer: 'P-NORTH' })],
  },
  {
    product: 'F-200',
    nodes: [SUPPLIER, CASTING, TIER_ONE, pathNode('item', 'H-20', 1, { buyer: 'P-NORTH' }),
      pathNode('product', 'F-200', 0, { buyer: 'P-NORTH' })],
  },
];

/** A hidden tier-2 single point of failure as the risk page reads it. */
export const SUPPLIER_RISK: RunSupplierDetailDto = {
  rank: 1, code: 'S-2-SHARED-A', name: 'Tarnwick Alloys', country: 'CZ', region: 'Europe',
  tier: 2, productsLost: ['F-100', 'F-200'], revenueExposedPerWeek: 90_000,
  revenueImpact: 540_000, timeToRecover: 10, singlePointOfFailure: true,
  betweenness: 412, degree: 0.0125, closeness: 0.3333, eigenvector: 0.0871, pagerank: 0.0042,
  nexusIndex: 0.6125, plants: ['P-NORTH'], likelihood: 3,
  likelihoodFactors: { financialHealth: 0.5, deliveryScore: 0.25, continuityPlan: 1,
    alternatives: 1, countryHazard: 0.25 },
  impactBand: 5, rating: 15, ratingBand: 'high', runId: 12, networkVersionId: 3,
  products: [
    { code: 'F-100', plantCode: 'P-NORTH', weeklyRevenue: 60_000, timeToSurvive: 4,
      lostWeeks: 6 },
    { code: 'F-200', plantCode: 'P-NORTH', weeklyRevenue: 30_000, timeToSurvive: 12,
      lostWeeks: 0 },
  ],
  failurePaths: FAILURE_PATHS,
  history: [
    { runId: 9, label: 'Q3 review', finishedAt: '2026-09-30T10:00:00.000Z',
      revenueImpact: 300_000, rating: 10, likelihood: 2, impactBand: 5, nexusIndex: 0.58 },
    { runId: 12, label: 'Q4 review', finishedAt: '2026-12-01T10:00:00.000Z',
      revenueImpact: 540_000, rating: 15, likelihood: 3, impactBand: 5, nexusIndex: 0.6125 },
  ],
  registerEntryId: 42,
};

/** A run of version `networkVersionId`. */
export function runOf(id: number, networkVersionId: number,
  status: AnalysisRunDto['status'] = 'succeeded'): AnalysisRunDto {
  return {
    id, networkVersionId, label: `Run ${id}`, kind: 'manual', status, progress: 1, stage: null,
    error: null, createdBy: null, createdAt: '2026-12-01T09:00:00.000Z',
    startedAt: '2026-12-01T09:00:01.000Z', finishedAt: '2026-12-01T09:00:09.000Z',
    timings: null, totals: null, methods: null,
  };
}

/** A grouped picture: one plant, one product, two supplier groups, one with a single point. */
export const AGGREGATED_PICTURE: NetworkPicture = {
  networkVersionId: 3, runId: 12, mode: 'aggregated', totalNodes: 4210, totalEdges: 8900,
  singlePoints: 1,
  nodes: [
    { id: 'plant:P-NORTH', kind: 'plant', code: 'P-NORTH', label: 'Varnholm Works', tier: null,
      column: 0, isSinglePoint: false, revenueImpact: null },
    { id: 'product:F-100', kind: 'product', code: 'F-100', label: 'Pump housing', tier: null,
      column: 1, isSinglePoint: false, revenueImpact: null },
    { id: 'group:1:DE', kind: 'supplierGroup', code: 'DE', label: 'Tier 1 · DE', tier: 1,
      column: 2, isSinglePoint: false, revenueImpact: 0, count: 40, singlePoints: 0 },
    { id: 'group:2:CZ', kind: 'supplierGroup', code: 'CZ', label: 'Tier 2 · CZ', tier: 2,
      column: 3, isSinglePoint: true, revenueImpact: 540_000, count: 12, singlePoints: 1 },
  ],
  edges: [
    { source: 'group:2:CZ', target: 'group:1:DE', count: 14 },
    { source: 'group:1:DE', target: 'product:F-100', count: 40 },
    { source: 'product:F-100', target: 'plant:P-NORTH', count: 1 },
  ],
};
