/**
 * What the plans feature tells the rest of the app after a change has been committed: the
 * notifications feature turns these into e-mails. Calls return at once; delivery happens in
 * the background and a failure is logged, never thrown back into the plan's request.
 */
import type { PlanStatus } from '@keelson/contracts';

/** A plan was submitted for approval by the managers of `plants`. */
export interface PlanSubmittedEvent {
  planId: number;
  plants: string[];
  byUserId: number;
}

/** A plant manager decided on a plan for one plant. */
export interface PlanDecidedEvent {
  planId: number;
  plantCode: string;
  decision: 'approved' | 'rejected';
  comment: string;
  byUserId: number;
  /** The plan's status after the decision (`submitted` while other plants are pending). */
  planStatus: PlanStatus;
}

/** A task became active with an owner, or an active task got a new owner. */
export interface TaskAssignedEvent {
  taskId: number;
  assigneeId: number;
  byUserId: number | null;
}

/** Listener of plan events. */
export interface PlanEvents {
  planSubmitted(event: PlanSubmittedEvent): void;
  planDecided(event: PlanDecidedEvent): void;
  taskAssigned(event: TaskAssignedEvent): void;
}

/** A listener that does nothing (specs of the plans feature alone). */
export const IGNORE_PLAN_EVENTS: PlanEvents = {
  planSubmitted() {},
  planDecided() {},
  taskAssigned() {},
};
