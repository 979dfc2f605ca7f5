/** Maps plan rows to the DTOs of `@keelson/contracts`. */
import type {
  PlanChange,
  PlanDecisionDto,
  PlanDto,
  PlanEntrySummaryDto,
  PlanSummaryDto,
  PlanTaskDto,
  TaskCommentDto,
  WhatIfResultDto,
} from '@keelson/contracts';
import { isActivePlan, isTaskOverdue } from './plan-rules';
import type {
  CommentRecord,
  DecisionRecord,
  PlanEntrySummary,
  PlanRecord,
  TaskRecord,
} from './plans.repository';

/** `{id, name}` of a user, or null when the user is gone. */
export function userRef(id: number | null, name: string | null): { id: number; name: string }
  | null {
  return id === null || name === null ? null : { id, name };
}

/** A plan's stored changes, typed. */
export function changesOf(plan: Pick<PlanRecord, 'changes'>): PlanChange[] {
  return plan.changes as unknown as PlanChange[];
}

/** A plan's stored what-if, typed. */
export function whatIfOf(plan: Pick<PlanRecord, 'whatIf'>): WhatIfResultDto | null {
  return (plan.whatIf ?? null) as unknown as WhatIfResultDto | null;
}

/** What a plan shows of its entry. */
export function toPlanEntrySummaryDto(entry: PlanEntrySummary): PlanEntrySummaryDto {
  return {
    id: entry.id,
    title: entry.title,
    supplierCode: entry.supplierCode,
    supplierName: entry.supplierName,
    status: entry.status,
    rating: entry.rating,
    ratingBand: entry.ratingBand,
    runId: entry.runId,
  };
}

/** A plan as listed. */
export function toPlanSummaryDto(
  plan: PlanRecord,
  entry: PlanEntrySummary,
  pendingPlants: readonly string[],
): PlanSummaryDto {
  const after = whatIfOf(plan)?.after;
  return {
    id: plan.id,
    entry: toPlanEntrySummaryDto(entry),
    strategy: plan.strategy,
    description: plan.description,
    estimatedCost: plan.estimatedCost,
    targetDate: plan.targetDate,
    status: plan.status,
    author: userRef(plan.authorId, plan.authorName),
    plants: [...entry.plants],
    pendingPlants: [...pendingPlants],
    whatIfAfter: after
      ? { singlePointOfFailure: after.singlePointOfFailure, rating: after.rating,
        ratingBand: after.ratingBand, revenueImpact: after.revenueImpact }
      : null,
    createdAt: plan.createdAt,
    updatedAt: plan.updatedAt,
    submittedAt: plan.submittedAt,
    decidedAt: plan.decidedAt,
  };
}

/** A task; `planStatus` decides whether it is active, `today` whether it is overdue. */
export function toPlanTaskDto(
  task: TaskRecord,
  planStatus: PlanRecord['status'],
  today: string,
): PlanTaskDto {
  return {
    id: task.id,
    planId: task.planId,
    title: task.title,
    owner: userRef(task.ownerId, task.ownerName),
    dueDate: task.dueDate,
    status: task.status,
    isOverdue: isTaskOverdue(task, today),
    isActive: isActivePlan(planStatus),
    commentCount: task.commentCount,
    createdAt: task.createdAt,
    updatedAt: task.updatedAt,
  };
}

/** One plant decision. */
export function toPlanDecisionDto(decision: DecisionRecord): PlanDecisionDto {
  return {
    id: decision.id,
    plantCode: decision.plantCode,
    decision: decision.decision,
    comment: decision.comment,
    user: userRef(decision.userId, decision.userName),
    submittedAt: decision.submittedAt,
    createdAt: decision.createdAt,
  };
}

/** One comment on a task. */
export function toTaskCommentDto(comment: CommentRecord): TaskCommentDto {
  return {
    id: comment.id,
    text: comment.text,
    user: userRef(comment.userId, comment.userName),
    createdAt: comment.createdAt,
  };
}

/** The parts of a {@link PlanDto} beyond its summary. */
export interface PlanDetailParts {
  decisions: readonly DecisionRecord[];
  tasks: readonly TaskRecord[];
  can: PlanDto['can'];
  today: string;
}

/** A plan with its changes, what-if, decisions, tasks and the user's permissions. */
export function toPlanDto(
  plan: PlanRecord,
  entry: PlanEntrySummary,
  pendingPlants: readonly string[],
  parts: PlanDetailParts,
): PlanDto {
  return {
    ...toPlanSummaryDto(plan, entry, pendingPlants),
    changes: changesOf(plan),
    whatIf: whatIfOf(plan),
    rejectionComment: plan.rejectionComment,
    decisions: parts.decisions.map(toPlanDecisionDto),
    tasks: parts.tasks.map((task) => toPlanTaskDto(task, plan.status, parts.today)),
    can: parts.can,
  };
}
