/**
 * Drizzle access to mitigation plans and what hangs off them: the register entry a plan belongs
 * to (with its plants and its supplier's name in the latest network version), the plant
 * decisions, the tasks with their owners and comment counts, and the comments.
 */
import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { PlanStatus, TaskStatus } from '@keelson/contracts';
import {
  mitigationPlans,
  networkSuppliers,
  planDecisions,
  planTasks,
  registerEntries,
  registerEntryPlants,
  taskComments,
  users,
  type KeelsonDatabase,
} from '@keelson/db';
import { valueList } from '../network/network-sql';
import type { PlantScope } from '../network/plant-scope';

/** A row of `mitigation_plans`. */
export type PlanRow = typeof mitigationPlans.$inferSelect;
/** A row of `plan_tasks`. */
export type TaskRow = typeof planTasks.$inferSelect;

/** What a plan shows of its register entry, and what its rules need from it. */
export interface PlanEntryRecord {
  id: number;
  title: string;
  supplierCode: string;
  supplierName: string | null;
  status: (typeof registerEntries.$inferSelect)['status'];
  rating: number;
  ratingBand: (typeof registerEntries.$inferSelect)['ratingBand'];
  runId: number | null;
  likelihoodOverride: number | null;
}

/** A plan with its author's name. */
export interface PlanRecord extends PlanRow {
  authorName: string | null;
}

/** A decision with the name of who made it. */
export interface DecisionRecord {
  id: number;
  planId: number;
  plantCode: string;
  decision: 'approved' | 'rejected';
  comment: string;
  userId: number | null;
  userName: string | null;
  submittedAt: string;
  createdAt: string;
}

/** A task with its owner's name and how many comments it has. */
export interface TaskRecord extends TaskRow {
  ownerName: string | null;
  commentCount: number;
}

/** A comment with its writer's name. */
export interface CommentRecord {
  id: number;
  taskId: number;
  text: string;
  userId: number | null;
  userName: string | null;
  createdAt: string;
}

/** Filters of {@link PlansRepository.plans}. */
export interface PlanFilter {
  status?: PlanStatus;
  entryId?: number;
  /** Plans whose entry has one of these plants; null for no plant condition. */
  plants: PlantScope;
}

const p = mitigationPlans;
const t = planTasks;

/** Drizzle access to `mitigation_plans`, `plan_decisions`, `plan_tasks`, `task_comments`. */
export class PlansRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Runs `work` in one transaction (better-sqlite3 transactions are synchronous). */
  transaction<T>(work: () => T): T {
    return this.db.transaction(() => work());
  }

  /** Register entries by id, with their supplier's name in version `versionId`. */
  entries(versionId: number | null, ids: readonly number[]): Map<number, PlanEntrySummary> {
    const found = new Map<number, PlanEntrySummary>();
    if (ids.length === 0) return found;
    const e = registerEntries;
    const rows = this.db.select({ id: e.id, title: e.title, supplierCode: e.supplierCode,
      supplierName: networkSuppliers.name, status: e.status, rating: e.rating,
      ratingBand: e.ratingBand, runId: e.runId, likelihoodOverride: e.likelihoodOverride })
      .from(e)
      .leftJoin(networkSuppliers, and(eq(networkSuppliers.versionId, versionId ?? -1),
        eq(networkSuppliers.code, e.supplierCode)))
      .where(inArray(e.id, [...new Set(ids)])).all();
    const plants = this.entryPlants(ids);
    for (const row of rows) found.set(row.id, { ...row, plants: plants.get(row.id) ?? [] });
    return found;
  }

  /** Plant codes per entry id, sorted. */
  entryPlants(ids: readonly number[]): Map<number, string[]> {
    const plants = new Map<number, string[]>(ids.map((id) => [id, []]));
    if (ids.length === 0) return plants;
    const rows = this.db.select().from(registerEntryPlants)
      .where(inArray(registerEntryPlants.entryId, [...new Set(ids)]))
      .orderBy(asc(registerEntryPlants.plantCode)).all();
    for (const row of rows) plants.get(row.entryId)?.push(row.plantCode);
    return plants;
  }

  /** Changes a register entry's status. */
  setEntryStatus(id: number, status: PlanEntryRecord['status'], updatedAt: string): void {
    this.db.update(registerEntries).set({ status, updatedAt })
      .where(eq(registerEntries.id, id)).run();
  }

  /** One plan with its author's name, if it exists. */
  plan(id: number): PlanRecord | undefined {
    return this.selectPlans().where(eq(p.id, id)).get();
  }

  /** The plans matching `filter`, most recently changed first. */
  plans(filter: PlanFilter): PlanRecord[] {
    const conditions: SQL[] = [];
    if (filter.status) conditions.push(eq(p.status, filter.status));
    if (filter.entryId) conditions.push(eq(p.entryId, filter.entryId));
    if (filter.plants !== null) {
      conditions.push(filter.plants.length === 0 ? sql`0` : sql`${p.entryId} in (select
        ep.entry_id from register_entry_plants ep where ep.plant_code in
        ${valueList(filter.plants)})`);
    }
    return this.selectPlans().where(conditions.length > 0 ? and(...conditions) : undefined)
      .orderBy(desc(p.updatedAt), desc(p.id)).all();
  }

  /** Inserts a plan and returns its id. */
  insertPlan(row: typeof p.$inferInsert): number {
    return this.db.insert(p).values(row).returning({ id: p.id }).get().id;
  }

  /** Applies changes to one plan. */
  updatePlan(id: number, changes: Partial<typeof p.$inferInsert>): void {
    this.db.update(p).set(changes).where(eq(p.id, id)).run();
  }

  /** Decisions of plans, newest first. */
  decisions(planIds: readonly number[]): DecisionRecord[] {
    if (planIds.length === 0) return [];
    const d = planDecisions;
    return this.db.select({ id: d.id, planId: d.planId, plantCode: d.plantCode,
      decision: d.decision, comment: d.comment, userId: d.userId, userName: users.name,
      submittedAt: d.submittedAt, createdAt: d.createdAt })
      .from(d).leftJoin(users, eq(users.id, d.userId))
      .where(inArray(d.planId, [...new Set(planIds)]))
      .orderBy(desc(d.createdAt), desc(d.id)).all();
  }

  /** Appends a decision (the unique index refuses a second one per plant and submission). */
  insertDecision(row: typeof planDecisions.$inferInsert): number {
    return this.db.insert(planDecisions).values(row).returning({ id: planDecisions.id }).get().id;
  }

  /** Tasks of plans, in the order they were added. */
  tasksOf(planIds: readonly number[]): TaskRecord[] {
    if (planIds.length === 0) return [];
    return this.selectTasks().where(inArray(t.planId, [...new Set(planIds)]))
      .orderBy(asc(t.id)).all();
  }

  /** One task, if it exists. */
  task(id: number): TaskRecord | undefined {
    return this.selectTasks().where(eq(t.id, id)).get();
  }

  /**
   * A user's tasks (everyone's for `userId` null) on plans in one of `planStatuses`, with one
   * of `taskStatuses`.
   */
  tasksOwnedBy(
    userId: number | null,
    planStatuses: readonly PlanStatus[],
    taskStatuses: readonly TaskStatus[],
  ): (TaskRecord & { planStatus: PlanStatus; planStrategy: PlanRow['strategy'];
    entryId: number })[] {
    return this.db.select({ ...taskColumns, ownerName: users.name, commentCount: commentCount,
      planStatus: p.status, planStrategy: p.strategy, entryId: p.entryId })
      .from(t)
      .innerJoin(p, eq(p.id, t.planId))
      .leftJoin(users, eq(users.id, t.ownerId))
      .where(and(userId === null ? undefined : eq(t.ownerId, userId),
        inArray(p.status, [...planStatuses]),
        inArray(t.status, [...taskStatuses])))
      .orderBy(asc(t.id)).all();
  }

  /** Inserts a task and returns its id. */
  insertTask(row: typeof t.$inferInsert): number {
    return this.db.insert(t).values(row).returning({ id: t.id }).get().id;
  }

  /** Applies changes to one task. */
  updateTask(id: number, changes: Partial<typeof t.$inferInsert>): void {
    this.db.update(t).set(changes).where(eq(t.id, id)).run();
  }

  /** Deletes a task (its comments go with it). */
  deleteTask(id: number): void {
    this.db.delete(t).where(eq(t.id, id)).run();
  }

  /** The comments of a task, oldest first. */
  comments(taskId: number): CommentRecord[] {
    const c = taskComments;
    return this.db.select({ id: c.id, taskId: c.taskId, text: c.text, userId: c.userId,
      userName: users.name, createdAt: c.createdAt })
      .from(c).leftJoin(users, eq(users.id, c.userId))
      .where(eq(c.taskId, taskId)).orderBy(asc(c.id)).all();
  }

  /** Appends a comment and returns its id. */
  insertComment(row: typeof taskComments.$inferInsert): number {
    return this.db.insert(taskComments).values(row).returning({ id: taskComments.id }).get().id;
  }

  /** A user's name and whether they are active, if the user exists. */
  user(id: number): { id: number; name: string; isActive: boolean } | undefined {
    return this.db.select({ id: users.id, name: users.name, isActive: users.isActive })
      .from(users).where(eq(users.id, id)).get();
  }

  private selectPlans() {
    return this.db.select({ ...planColumns, authorName: users.name }).from(p)
      .leftJoin(users, eq(users.id, p.authorId)).$dynamic();
  }

  private selectTasks() {
    return this.db.select({ ...taskColumns, ownerName: users.name, commentCount })
      .from(t).leftJoin(users, eq(users.id, t.ownerId)).$dynamic();
  }
}

/** An entry as a plan needs it, with its plants. */
export interface PlanEntrySummary extends PlanEntryRecord {
  plants: string[];
}

const commentCount = sql<number>`(select count(*) from task_comments c
  where c.task_id = ${t.id})`.mapWith(Number);

const planColumns = {
  id: p.id, entryId: p.entryId, strategy: p.strategy, description: p.description,
  estimatedCost: p.estimatedCost, targetDate: p.targetDate, status: p.status, changes: p.changes,
  whatIf: p.whatIf, rejectionComment: p.rejectionComment, authorId: p.authorId,
  createdAt: p.createdAt, updatedAt: p.updatedAt, submittedAt: p.submittedAt,
  decidedAt: p.decidedAt,
};

const taskColumns = {
  id: t.id, planId: t.planId, title: t.title, ownerId: t.ownerId, dueDate: t.dueDate,
  status: t.status, createdAt: t.createdAt, updatedAt: t.updatedAt,
};
