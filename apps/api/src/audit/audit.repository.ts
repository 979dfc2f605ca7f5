/**
 * Drizzle reads of the audit trail (the only writer is `recordAudit` in audit-trail.ts): the
 * filtered trail for administrators, one subject's history, and the lookups that decide who may
 * read a register entry's or a plan's history.
 */
import { and, desc, eq, gte, inArray, lt, or, sql, type SQL } from 'drizzle-orm';
import type { AuditEventDto, ExportAuditQuery } from '@keelson/contracts';
import {
  auditEvents,
  mitigationPlans,
  planTasks,
  registerEntries,
  registerEntryPlants,
  users,
  type KeelsonDatabase,
} from '@keelson/db';

/** The filters of the trail (the list's and the export's, without paging). */
export type AuditFilters = ExportAuditQuery;

/** Escapes LIKE wildcards so a search for `50%` finds the text `50%`. */
function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** The day after a YYYY-MM-DD date, at midnight UTC, as the trail stores times. */
function dayAfter(date: string): string {
  const next = new Date(`${date}T00:00:00.000Z`);
  next.setUTCDate(next.getUTCDate() + 1);
  return next.toISOString();
}

/**
 * The WHERE of the filters. `action` ending in a dot (`plan.`) is a prefix, anything else is
 * exact; `from`/`to` are whole UTC days, both inclusive; `q` searches the action, the subject
 * type and id, and the before and after JSON text (ASCII letters in any case).
 */
export function auditWhere(filters: AuditFilters): SQL | undefined {
  const conditions: SQL[] = [];
  if (filters.action) {
    conditions.push(filters.action.endsWith('.')
      ? sql`substr(${auditEvents.action}, 1, ${filters.action.length}) = ${filters.action}`
      : eq(auditEvents.action, filters.action));
  }
  if (filters.subjectType) conditions.push(eq(auditEvents.subjectType, filters.subjectType));
  if (filters.subjectId) conditions.push(eq(auditEvents.subjectId, filters.subjectId));
  if (filters.userId !== undefined) conditions.push(eq(auditEvents.userId, filters.userId));
  if (filters.from) conditions.push(gte(auditEvents.createdAt, `${filters.from}T00:00:00.000Z`));
  if (filters.to) conditions.push(lt(auditEvents.createdAt, dayAfter(filters.to)));
  if (filters.q) {
    // SQLite's LIKE ignores case for ASCII letters only; other letters ("Á") match as typed.
    const pattern = likePattern(filters.q);
    conditions.push(or(
      sql`${auditEvents.action} like ${pattern} escape '\\'`,
      sql`(${auditEvents.subjectType} || ' ' || ${auditEvents.subjectId}) like ${pattern}
        escape '\\'`,
      sql`coalesce(${auditEvents.before}, '') like ${pattern} escape '\\'`,
      sql`coalesce(${auditEvents.after}, '') like ${pattern} escape '\\'`,
    )!);
  }
  return conditions.length > 0 ? and(...conditions) : undefined;
}

/** Reads of `audit_events` (joined with the acting user's name). */
export class AuditRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Matching events, newest first; every match when `page` is not given. */
  list(where: SQL | undefined, page?: { limit: number; offset: number }): AuditEventDto[] {
    const query = this.db
      .select({
        id: auditEvents.id,
        action: auditEvents.action,
        subjectType: auditEvents.subjectType,
        subjectId: auditEvents.subjectId,
        userId: auditEvents.userId,
        userName: users.name,
        before: auditEvents.before,
        after: auditEvents.after,
        createdAt: auditEvents.createdAt,
      })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.userId))
      .where(where)
      .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id));
    const rows = page ? query.limit(page.limit).offset(page.offset).all() : query.all();
    return rows.map((row) => ({
      id: row.id,
      action: row.action,
      subjectType: row.subjectType,
      subjectId: row.subjectId,
      user: row.userId === null ? null : { id: row.userId, name: row.userName ?? '' },
      before: row.before ?? null,
      after: row.after ?? null,
      createdAt: row.createdAt,
    }));
  }

  /** How many events match. */
  count(where: SQL | undefined): number {
    return this.db.select({ value: sql<number>`count(*)` }).from(auditEvents).where(where)
      .get()?.value ?? 0;
  }

  /** Whether the register entry exists. */
  entryExists(entryId: number): boolean {
    return this.db.select({ id: registerEntries.id }).from(registerEntries)
      .where(eq(registerEntries.id, entryId)).get() !== undefined;
  }

  /** The plants a register entry touches. */
  entryPlants(entryId: number): string[] {
    return this.db.select({ code: registerEntryPlants.plantCode }).from(registerEntryPlants)
      .where(eq(registerEntryPlants.entryId, entryId)).all().map((row) => row.code);
  }

  /** The register entry of a plan, or undefined when there is no such plan. */
  entryOfPlan(planId: number): number | undefined {
    return this.db.select({ entryId: mitigationPlans.entryId }).from(mitigationPlans)
      .where(eq(mitigationPlans.id, planId)).get()?.entryId;
  }

  /**
   * A register entry's history: its own events, and those of its plans and their tasks. Both
   * ways of belonging count, so a deleted task's events stay in: the event's before or after
   * names the entry (`entryId`), or its subject is a plan of the entry or a task of one.
   */
  entryHistoryWhere(entryId: number): SQL {
    const id = String(entryId);
    const planIds = this.db.select({ id: sql<string>`cast(${mitigationPlans.id} as text)` })
      .from(mitigationPlans).where(eq(mitigationPlans.entryId, entryId));
    const taskIds = this.db.select({ id: sql<string>`cast(${planTasks.id} as text)` })
      .from(planTasks).innerJoin(mitigationPlans, eq(mitigationPlans.id, planTasks.planId))
      .where(eq(mitigationPlans.entryId, entryId));
    return or(
      and(eq(auditEvents.subjectType, 'register_entry'), eq(auditEvents.subjectId, id)),
      and(inArray(auditEvents.subjectType, ['plan', 'plan_task']), or(
        sql`cast(json_extract(${auditEvents.after}, '$.entryId') as text) = ${id}`,
        sql`cast(json_extract(${auditEvents.before}, '$.entryId') as text) = ${id}`,
      )),
      and(eq(auditEvents.subjectType, 'plan'), inArray(auditEvents.subjectId, planIds)),
      and(eq(auditEvents.subjectType, 'plan_task'), inArray(auditEvents.subjectId, taskIds)),
    )!;
  }

  /** A plan's history: its own events and those of its tasks (by `planId` or by task id). */
  planHistoryWhere(planId: number): SQL {
    const id = String(planId);
    const taskIds = this.db.select({ id: sql<string>`cast(${planTasks.id} as text)` })
      .from(planTasks).where(eq(planTasks.planId, planId));
    return or(
      and(eq(auditEvents.subjectType, 'plan'), eq(auditEvents.subjectId, id)),
      and(eq(auditEvents.subjectType, 'plan_task'), or(
        sql`cast(json_extract(${auditEvents.after}, '$.planId') as text) = ${id}`,
        sql`cast(json_extract(${auditEvents.before}, '$.planId') as text) = ${id}`,
        inArray(auditEvents.subjectId, taskIds),
      )),
    )!;
  }

  /** Any other subject's history: its own events. */
  subjectWhere(subjectType: string, subjectId: string): SQL {
    return and(eq(auditEvents.subjectType, subjectType), eq(auditEvents.subjectId, subjectId))!;
  }
}
