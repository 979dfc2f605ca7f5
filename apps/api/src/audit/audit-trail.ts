/**
 * The audit trail's one writer: every change that matters (imports, runs, likelihood overrides,
 * register edits, plan submissions and decisions, task changes, user and role changes) appends
 * one row with who, when, what, and the before and after. Call it inside the transaction of the
 * change itself, so the change and its record land together. The table refuses updates and
 * deletes (triggers in migration 0003), so a record, once written, stays as it was.
 */
import { auditEvents, type KeelsonDatabase } from '@keelson/db';

/** One change to record. */
export interface AuditEvent {
  /** What happened, as `<subject>.<verb>`: `import.committed`, `register.likelihood_overridden`. */
  action: string;
  subjectType: string;
  subjectId: string | number;
  /** Who did it; null for the system (a scheduled run). */
  userId: number | null;
  before?: Record<string, unknown> | null;
  after?: Record<string, unknown> | null;
}

/** Appends one event and returns its id. */
export function recordAudit(db: KeelsonDatabase, event: AuditEvent, now: Date): number {
  return db.insert(auditEvents).values({
    action: event.action,
    subjectType: event.subjectType,
    subjectId: String(event.subjectId),
    userId: event.userId,
    before: event.before ?? null,
    after: event.after ?? null,
    createdAt: now.toISOString(),
  }).returning({ id: auditEvents.id }).get().id;
}
