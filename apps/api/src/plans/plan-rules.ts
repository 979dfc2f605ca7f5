/**
 * The rules of a plan's lifecycle, as pure functions: which statuses can be edited, withdrawn
 * or worked on, whether the what-if is out of date, which plants are still to decide, what the
 * signed-in user may do, and the 403 messages that say why not.
 */
import {
  PLAN_STATUS_LABELS,
  type PlanChange,
  type PlanDto,
  type PlanStatus,
  type Role,
  type WhatIfResultDto,
} from '@keelson/contracts';
import { forbidden, type AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { DecisionRecord, PlanRow } from './plans.repository';

/** The roles that draft, edit, submit, withdraw and evaluate plans. */
export const PLAN_WRITERS = ['risk_manager', 'admin'] as const satisfies readonly Role[];

/** Statuses in which a plan (and its task list) can be edited. */
export const EDITABLE_STATUSES: readonly PlanStatus[] = ['draft', 'rejected'];

/** Statuses in which a plan's tasks are "on": their status changes, they are in my tasks. */
export const ACTIVE_STATUSES: readonly PlanStatus[] = ['approved', 'in_progress'];

/** Statuses a plan can be withdrawn from (everything but `done` and `withdrawn`). */
export const WITHDRAWABLE_STATUSES: readonly PlanStatus[] = ['draft', 'rejected', 'submitted',
  'approved', 'in_progress'];

/** Whether the user drafts and edits plans. */
export function isPlanWriter(user: Pick<SessionUser, 'role'>): boolean {
  return (PLAN_WRITERS as readonly Role[]).includes(user.role);
}

/** Whether a plan in `status` can be edited. */
export function isEditable(status: PlanStatus): boolean {
  return EDITABLE_STATUSES.includes(status);
}

/** Whether the tasks of a plan in `status` are active. */
export function isActivePlan(status: PlanStatus): boolean {
  return ACTIVE_STATUSES.includes(status);
}

/**
 * The 403 for a change to a plan that is not a draft or rejected: a submitted plan waits for
 * its decisions, a decided one keeps the content it was decided on, a withdrawn one is closed.
 */
export function notEditable(plan: Pick<PlanRow, 'id' | 'status'>): AppError {
  const { id, status } = plan;
  if (status === 'submitted') {
    return forbidden(`Plan ${id} is waiting for approval and cannot be edited; withdraw it and ` +
      'draft a new plan if it must change.', { status });
  }
  if (status === 'withdrawn') {
    return forbidden(`Plan ${id} is withdrawn and cannot be edited.`, { status });
  }
  return forbidden(`Plan ${id} is ${PLAN_STATUS_LABELS[status].toLowerCase()}; a decided plan ` +
    'cannot be edited.', { status });
}

/** Throws {@link notEditable} unless the plan is a draft or rejected. */
export function assertEditable(plan: Pick<PlanRow, 'id' | 'status'>): void {
  if (!isEditable(plan.status)) throw notEditable(plan);
}

/** The same JSON for the same value whatever the key order, to compare change lists. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, item]) => item !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`)
      .join(',')}}`;
  }
  return JSON.stringify(value);
}

/**
 * Whether the plan proposes network changes that the stored what-if was not run on (none yet,
 * or the changes were edited since). A plan without changes needs no what-if.
 */
export function needsWhatIf(changes: readonly PlanChange[], whatIf: WhatIfResultDto | null):
  boolean {
  if (changes.length === 0) return false;
  return whatIf === null || canonicalJson(whatIf.changes) !== canonicalJson(changes);
}

/** Decisions of the plan's current submission (none before its first submission). */
export function currentDecisions(
  plan: Pick<PlanRow, 'id' | 'submittedAt'>,
  decisions: readonly DecisionRecord[],
): DecisionRecord[] {
  if (plan.submittedAt === null) return [];
  return decisions.filter((decision) => decision.planId === plan.id
    && decision.submittedAt === plan.submittedAt);
}

/** The plants still to decide: while submitted, the entry's plants without a decision. */
export function pendingPlants(
  plan: Pick<PlanRow, 'id' | 'status' | 'submittedAt'>,
  plants: readonly string[],
  decisions: readonly DecisionRecord[],
): string[] {
  if (plan.status !== 'submitted') return [];
  const decided = new Set(currentDecisions(plan, decisions).map((decision) => decision.plantCode));
  return plants.filter((plant) => !decided.has(plant));
}

/** What {@link permissionsOf} reads of a plan. */
export interface PlanPermissionInput {
  plan: Pick<PlanRow, 'status' | 'authorId'>;
  changes: readonly PlanChange[];
  whatIf: WhatIfResultDto | null;
  pendingPlants: readonly string[];
}

/** `PlanDto.can` for a user: what they may do with the plan now. */
export function permissionsOf(user: SessionUser, input: PlanPermissionInput): PlanDto['can'] {
  const { plan } = input;
  const writer = isPlanWriter(user);
  const edit = writer && isEditable(plan.status);
  const mayDecide = user.role === 'plant_manager' && plan.status === 'submitted'
    && plan.authorId !== user.id;
  return {
    edit,
    submit: edit && !needsWhatIf(input.changes, input.whatIf),
    withdraw: writer && WITHDRAWABLE_STATUSES.includes(plan.status),
    decideFor: mayDecide ? input.pendingPlants.filter((plant) => user.plantCodes.includes(plant))
      : [],
  };
}

/** Today's date (UTC) as `YYYY-MM-DD`. */
export function todayOf(now: Date): string {
  return now.toISOString().slice(0, 10);
}

/** Whether a task is overdue: due before today and still to do or being done. */
export function isTaskOverdue(task: { dueDate: string | null; status: string }, today: string):
  boolean {
  return task.dueDate !== null && task.dueDate < today
    && (task.status === 'todo' || task.status === 'doing');
}
