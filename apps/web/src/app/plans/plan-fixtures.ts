import type {
  MyTaskDto,
  PlanChange,
  PlanDto,
  PlanSummaryDto,
  PlanTaskDto,
  WhatIfResultDto,
  WhatIfSideDto,
} from '@keelson/contracts';

/** The change the fixtures' plans propose: a second caster for every buyer. */
export const SECOND_SOURCE: PlanChange = {
  kind: 'add_source',
  itemCode: 'I-CAST-1',
  supplierCode: 'S-2-ALT',
  buyerCode: null,
};

/**
 * Plans, what-ifs and tasks for the client's tests, shaped like the API's answers. The numbers
 * are invented; the supplier, item and plant codes follow the demo network's patterns.
 */
export function whatIfSide(overrides: Partial<WhatIfSideDto> = {}): WhatIfSideDto {
  return {
    productsLost: ['P-100', 'P-200'],
    revenueExposedPerWeek: 120_000,
    revenueImpact: 1_440_000,
    timeToRecover: 12,
    singlePointOfFailure: true,
    impactBand: 5,
    likelihood: 4,
    rating: 20,
    ratingBand: 'critical',
    ...overrides,
  };
}

/** A what-if where the second source takes the supplier off the single points of failure. */
export function whatIfResult(overrides: Partial<WhatIfResultDto> = {}): WhatIfResultDto {
  return {
    networkVersionId: 3,
    supplierCode: 'S-2-SHARED-A',
    changes: [SECOND_SOURCE],
    before: whatIfSide(),
    after: whatIfSide({
      productsLost: [],
      revenueExposedPerWeek: 0,
      revenueImpact: 0,
      timeToRecover: 0,
      singlePointOfFailure: false,
      impactBand: 1,
      rating: 4,
      ratingBand: 'low',
    }),
    evaluatedAt: '2026-12-01T10:00:00.000Z',
    evaluatedBy: { id: 3, name: 'Rania Okafor' },
    ...overrides,
  };
}

/** A task of plan 7. */
export function planTask(id: number, overrides: Partial<PlanTaskDto> = {}): PlanTaskDto {
  return {
    id,
    planId: 7,
    title: `Qualify the second caster (${id})`,
    owner: { id: 2, name: 'Bruno Keller' },
    dueDate: '2027-01-15',
    status: 'todo',
    isOverdue: false,
    isActive: false,
    commentCount: 0,
    createdAt: '2026-12-01T09:00:00.000Z',
    updatedAt: '2026-12-01T09:00:00.000Z',
    ...overrides,
  };
}

/** A plan as listed. */
export function planSummary(id: number, overrides: Partial<PlanSummaryDto> = {}):
  PlanSummaryDto {
  return {
    id,
    entry: {
      id: 12,
      title: 'Single source for cast housings',
      supplierCode: 'S-2-SHARED-A',
      supplierName: 'Brenna Foundry',
      status: 'open',
      rating: 20,
      ratingBand: 'critical',
      runId: 5,
    },
    strategy: 'second_source',
    description: 'Qualify a second caster for the housing blanks.',
    estimatedCost: 45_000,
    targetDate: '2027-03-31',
    status: 'draft',
    author: { id: 3, name: 'Rania Okafor' },
    plants: ['P-NORTH', 'P-SOUTH'],
    pendingPlants: [],
    whatIfAfter: null,
    createdAt: '2026-12-01T09:00:00.000Z',
    updatedAt: '2026-12-01T09:30:00.000Z',
    submittedAt: null,
    decidedAt: null,
    ...overrides,
  };
}

/** A plan as GET /api/plans/:id answers. */
export function planDetail(id: number, overrides: Partial<PlanDto> = {}): PlanDto {
  return {
    ...planSummary(id, overrides),
    changes: [SECOND_SOURCE],
    whatIf: null,
    rejectionComment: null,
    decisions: [],
    tasks: [planTask(31)],
    can: { edit: false, submit: false, withdraw: false, decideFor: [] },
    ...overrides,
  };
}

/** One of my tasks. */
export function myTask(id: number, overrides: Partial<MyTaskDto> = {}): MyTaskDto {
  return {
    ...planTask(id, { isActive: true }),
    plan: {
      id: 7,
      strategy: 'second_source',
      status: 'approved',
      entry: { id: 12, title: 'Single source for cast housings', supplierCode: 'S-2-SHARED-A' },
    },
    ...overrides,
  };
}
