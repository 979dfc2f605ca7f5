/**
 * Mitigation plans: what is done about a register entry, its what-if (the network re-analysed
 * with the plan's proposed changes), the approval by the manager of every plant the risk
 * touches, and the plan's tasks with their comments. The lifecycle is
 * `draft -> submitted -> approved | rejected -> in_progress -> done`, or `withdrawn`; a rejected
 * plan goes back to draft with the rejection comment kept on it.
 */
import { z } from 'zod';
import type { RatingBand } from './runs';
import type { RegisterStatus } from './register';

/** Mitigation strategies. */
export const PLAN_STRATEGIES = ['second_source', 'safety_stock', 'qualify_alternate',
  'contract_terms', 'accept', 'other'] as const;
/** One of {@link PLAN_STRATEGIES}. */
export type PlanStrategy = (typeof PLAN_STRATEGIES)[number];

/** Labels of the strategies, for screens and e-mails. */
export const PLAN_STRATEGY_LABELS: Record<PlanStrategy, string> = {
  second_source: 'Second source',
  safety_stock: 'Safety stock',
  qualify_alternate: 'Qualify an alternate',
  contract_terms: 'Contract terms',
  accept: 'Accept the risk',
  other: 'Other',
};

/** Where a plan stands. */
export const PLAN_STATUSES = ['draft', 'submitted', 'approved', 'rejected', 'in_progress',
  'done', 'withdrawn'] as const;
/** One of {@link PLAN_STATUSES}. */
export type PlanStatus = (typeof PLAN_STATUSES)[number];

/** Labels of the plan statuses. */
export const PLAN_STATUS_LABELS: Record<PlanStatus, string> = {
  draft: 'Draft',
  submitted: 'Waiting for approval',
  approved: 'Approved',
  rejected: 'Rejected',
  in_progress: 'In progress',
  done: 'Done',
  withdrawn: 'Withdrawn',
};

/** Where a task stands. */
export const TASK_STATUSES = ['todo', 'doing', 'done', 'cancelled'] as const;
/** One of {@link TASK_STATUSES}. */
export type TaskStatus = (typeof TASK_STATUSES)[number];

/** Labels of the task statuses. */
export const TASK_STATUS_LABELS: Record<TaskStatus, string> = {
  todo: 'To do',
  doing: 'Doing',
  done: 'Done',
  cancelled: 'Cancelled',
};

const code = z.string().trim().min(1).max(60);
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD');

/**
 * A proposed change to the network, for the what-if:
 * - `add_source`: `supplierCode` becomes a qualified source of `itemCode` for `buyerCode` (a
 *   plant or a supplier, as in the Sourcing sheet); `buyerCode` null means every buyer that buys
 *   the item from the plan's supplier today. A supplier not in the version needs `newSupplier`.
 * - `raise_cover`: the weeks of cover of `itemCode` at `plantCode` become `weeksOfCover`.
 * - `set_recovery`: the time to recover of `supplierCode` becomes `recoveryWeeks`.
 */
export const planChangeSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('add_source'),
    itemCode: code,
    supplierCode: code,
    buyerCode: code.nullable().default(null),
    newSupplier: z.object({
      name: z.string().trim().min(1).max(200),
      country: z.string().trim().min(1).max(60),
      region: z.string().trim().max(60).default(''),
      recoveryWeeks: z.number().min(0).max(520).default(8),
    }).optional(),
  }),
  z.object({
    kind: z.literal('raise_cover'),
    plantCode: code,
    itemCode: code,
    weeksOfCover: z.number().min(0).max(520),
  }),
  z.object({
    kind: z.literal('set_recovery'),
    supplierCode: code,
    recoveryWeeks: z.number().min(0).max(520),
  }),
]);
/** One proposed change to the network. */
export type PlanChange = z.infer<typeof planChangeSchema>;
/** The kinds of {@link PlanChange}. */
export type PlanChangeKind = PlanChange['kind'];

/** One side (before or after the changes) of a what-if, for the plan's supplier. */
export interface WhatIfSideDto {
  /** Products lost when the supplier fails alone. */
  productsLost: string[];
  revenueExposedPerWeek: number;
  revenueImpact: number;
  /**
   * The supplier's time to recover in weeks (spec section 4: the largest recovery_weeks of the
   * failure set), whether or not anything is lost; a product's lost weeks are this minus its
   * stock cover.
   */
  timeToRecover: number;
  singlePointOfFailure: boolean;
  impactBand: number;
  /** The entry's likelihood: its override if it has one, else computed on this network. */
  likelihood: number;
  rating: number;
  ratingBand: RatingBand;
}

/** A what-if: the plan's supplier failing alone, on the version and on the changed copy. */
export interface WhatIfResultDto {
  networkVersionId: number;
  supplierCode: string;
  changes: PlanChange[];
  before: WhatIfSideDto;
  after: WhatIfSideDto;
  evaluatedAt: string;
  evaluatedBy: { id: number; name: string } | null;
}

/** One plant manager's decision on one submission of a plan, for one plant. */
export interface PlanDecisionDto {
  id: number;
  plantCode: string;
  decision: 'approved' | 'rejected';
  comment: string;
  user: { id: number; name: string } | null;
  submittedAt: string;
  createdAt: string;
}

/** A comment on a task. */
export interface TaskCommentDto {
  id: number;
  text: string;
  user: { id: number; name: string } | null;
  createdAt: string;
}

/** A task of a plan. */
export interface PlanTaskDto {
  id: number;
  planId: number;
  title: string;
  owner: { id: number; name: string } | null;
  dueDate: string | null;
  status: TaskStatus;
  /** Due before today and not done or cancelled. */
  isOverdue: boolean;
  /** False until the plan is approved (tasks are "on" from approval). */
  isActive: boolean;
  commentCount: number;
  createdAt: string;
  updatedAt: string;
}

/** GET /api/tasks/:id answer: a task with its comments and where it belongs. */
export interface PlanTaskDetailDto extends PlanTaskDto {
  comments: TaskCommentDto[];
  plan: PlanSummaryDto;
}

/** What a list shows of a plan's register entry. */
export interface PlanEntrySummaryDto {
  id: number;
  title: string;
  supplierCode: string;
  supplierName: string | null;
  status: RegisterStatus;
  rating: number;
  ratingBand: RatingBand;
  runId: number | null;
}

/** A plan as listed (approvals, an entry's plans). */
export interface PlanSummaryDto {
  id: number;
  entry: PlanEntrySummaryDto;
  strategy: PlanStrategy;
  description: string;
  estimatedCost: number | null;
  targetDate: string | null;
  status: PlanStatus;
  author: { id: number; name: string } | null;
  /** The plants the risk touches: each one's manager decides. */
  plants: string[];
  /** Plants of the current submission still without a decision. */
  pendingPlants: string[];
  /** The what-if's after-side in short, when one was run. */
  whatIfAfter: Pick<WhatIfSideDto, 'singlePointOfFailure' | 'rating' | 'ratingBand'
    | 'revenueImpact'> | null;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
}

/** GET /api/plans/:id answer. */
export interface PlanDto extends PlanSummaryDto {
  changes: PlanChange[];
  whatIf: WhatIfResultDto | null;
  /** The comment of the last rejection (shown on the draft it went back to). */
  rejectionComment: string | null;
  /** Decisions of every submission, newest first. */
  decisions: PlanDecisionDto[];
  tasks: PlanTaskDto[];
  /** What the signed-in user may do with the plan now (the server decides again on each call). */
  can: {
    edit: boolean;
    submit: boolean;
    withdraw: boolean;
    /** Plants the user may decide for now. */
    decideFor: string[];
  };
}

const taskInputSchema = z.object({
  title: z.string().trim().min(1, 'give the task a title').max(200),
  ownerId: z.number().int().positive().nullable().default(null),
  dueDate: isoDate.nullable().default(null),
});

/** POST /api/register/:entryId/plans body (a new draft). */
export const createPlanSchema = z.object({
  strategy: z.enum(PLAN_STRATEGIES),
  description: z.string().trim().min(1, 'describe the plan').max(10_000),
  estimatedCost: z.number().min(0).max(1e12).nullable().default(null),
  targetDate: isoDate.nullable().default(null),
  changes: z.array(planChangeSchema).max(50).default([]),
  tasks: z.array(taskInputSchema).max(100).default([]),
});
/** POST /api/register/:entryId/plans body. */
export type CreatePlanInput = z.infer<typeof createPlanSchema>;

/** PATCH /api/plans/:id body (a draft only). */
export const updatePlanSchema = z.object({
  strategy: z.enum(PLAN_STRATEGIES).optional(),
  description: z.string().trim().min(1, 'describe the plan').max(10_000).optional(),
  estimatedCost: z.number().min(0).max(1e12).nullable().optional(),
  targetDate: isoDate.nullable().optional(),
  changes: z.array(planChangeSchema).max(50).optional(),
});
/** PATCH /api/plans/:id body. */
export type UpdatePlanInput = z.infer<typeof updatePlanSchema>;

/** POST /api/plans/:id/decisions body. */
export const decidePlanSchema = z.object({
  plantCode: code,
  decision: z.enum(['approved', 'rejected']),
  comment: z.string().trim().max(5000).default(''),
}).refine((body) => body.decision === 'approved' || body.comment.length >= 5, {
  message: 'say why the plan is rejected, in at least 5 characters',
  path: ['comment'],
});
/** POST /api/plans/:id/decisions body. */
export type DecidePlanInput = z.infer<typeof decidePlanSchema>;

/** POST /api/plans/:id/tasks body. */
export const createTaskSchema = taskInputSchema;
/** POST /api/plans/:id/tasks body. */
export type CreateTaskInput = z.infer<typeof createTaskSchema>;

/** PATCH /api/tasks/:id body. */
export const updateTaskSchema = z.object({
  title: z.string().trim().min(1, 'give the task a title').max(200).optional(),
  ownerId: z.number().int().positive().nullable().optional(),
  dueDate: isoDate.nullable().optional(),
  status: z.enum(TASK_STATUSES).optional(),
});
/** PATCH /api/tasks/:id body. */
export type UpdateTaskInput = z.infer<typeof updateTaskSchema>;

/** POST /api/tasks/:id/comments body. */
export const createTaskCommentSchema = z.object({
  text: z.string().trim().min(1, 'write a comment').max(5000),
});
/** POST /api/tasks/:id/comments body. */
export type CreateTaskCommentInput = z.infer<typeof createTaskCommentSchema>;

/** GET /api/plans query (approvals and plan lists). */
export const listPlansQuerySchema = z.object({
  /** Only plans waiting for a decision the signed-in user can make. */
  awaitingMe: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
  status: z.enum(PLAN_STATUSES).optional(),
  entryId: z.coerce.number().int().positive().optional(),
  /**
   * `summary` (the default) lists {@link PlanSummaryDto}s; `full` lists whole {@link PlanDto}s
   * (both what-if sides, decisions, tasks, what the user may do), as the approvals page shows.
   */
  detail: z.enum(['summary', 'full']).default('summary'),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});
/** GET /api/plans query. */
export type ListPlansQuery = z.infer<typeof listPlansQuerySchema>;

/** GET /api/plans answer. */
export interface PlanListDto {
  items: PlanSummaryDto[];
  total: number;
}

/** GET /api/plans?detail=full answer. */
export interface PlanDetailListDto {
  items: PlanDto[];
  total: number;
}

/** A task as listed in "my tasks": with its plan and entry. */
export interface MyTaskDto extends PlanTaskDto {
  plan: Pick<PlanSummaryDto, 'id' | 'strategy' | 'status'> & {
    entry: Pick<PlanEntrySummaryDto, 'id' | 'title' | 'supplierCode'>;
  };
}

/** Which tasks a task list shows: open (to do or doing), overdue only, or every status. */
export const TASK_LIST_SHOWS = ['open', 'overdue', 'all'] as const;
/** One of {@link TASK_LIST_SHOWS}. */
export type TaskListShow = (typeof TASK_LIST_SHOWS)[number];

/** GET /api/tasks/mine and GET /api/tasks query. */
export const myTasksQuerySchema = z.object({
  /**
   * `open` (todo and doing, the default), `overdue` (open and due before today) or `all`
   * (every status, also on plans that are done).
   */
  show: z.enum(TASK_LIST_SHOWS).default('open'),
});
/** GET /api/tasks/mine and GET /api/tasks query. */
export type MyTasksQuery = z.infer<typeof myTasksQuerySchema>;

/**
 * GET /api/tasks/mine answer (and GET /api/tasks: everyone's, for risk managers and
 * administrators): overdue first, then by due date (none last), then id.
 */
export interface MyTasksDto {
  items: MyTaskDto[];
}
