/**
 * Status changes of a plan that follow from another change, each with its audit record. Call
 * them inside the transaction of the change that causes them.
 */
import type { PlanStatus } from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import type { PlanRow, PlansRepository } from './plans.repository';

/** What a transition writes with. */
export interface TransitionContext {
  repository: PlansRepository;
  db: KeelsonDatabase;
  userId: number | null;
  now: Date;
}

/**
 * Moves a plan to `status` and records `action` with the status before and after (and
 * `extra` fields in the after); returns the new status.
 */
export function movePlan(
  context: TransitionContext,
  plan: Pick<PlanRow, 'id' | 'entryId' | 'status'>,
  status: PlanStatus,
  action: string,
  extra: { changes?: Record<string, unknown>; after?: Record<string, unknown> } = {},
): PlanStatus {
  const stamp = context.now.toISOString();
  context.repository.updatePlan(plan.id, { status, updatedAt: stamp, ...extra.changes });
  recordAudit(context.db, { action, subjectType: 'plan', subjectId: plan.id,
    userId: context.userId, before: { status: plan.status },
    after: { status, entryId: plan.entryId, ...extra.after } }, context.now);
  return status;
}

/** A rejected plan that is edited goes back to draft (its rejection comment stays). */
export function reopenIfRejected(
  context: TransitionContext,
  plan: Pick<PlanRow, 'id' | 'entryId' | 'status'>,
): PlanStatus {
  if (plan.status !== 'rejected') return plan.status;
  return movePlan(context, plan, 'draft', 'plan.updated');
}

/**
 * After an approval or a task's status change on an active plan: the first task that is being
 * done (or done) moves an approved plan to `in_progress`, and a plan with no task left to do
 * or being done (every task done or cancelled, or no tasks at all) is `done`.
 */
export function settleActivePlan(
  context: TransitionContext,
  plan: Pick<PlanRow, 'id' | 'entryId' | 'status'>,
): PlanStatus {
  let status = plan.status;
  if (status !== 'approved' && status !== 'in_progress') return status;
  const tasks = context.repository.tasksOf([plan.id]);
  const started = tasks.some((task) => task.status === 'doing' || task.status === 'done');
  if (status === 'approved' && started) {
    status = movePlan(context, { ...plan, status }, 'in_progress', 'plan.in_progress');
  }
  const open = tasks.some((task) => task.status === 'todo' || task.status === 'doing');
  if (!open) {
    status = movePlan(context, { ...plan, status }, 'done', 'plan.done',
      { after: { tasksDone: tasks.filter((task) => task.status === 'done').length,
        tasksCancelled: tasks.filter((task) => task.status === 'cancelled').length } });
  }
  return status;
}
