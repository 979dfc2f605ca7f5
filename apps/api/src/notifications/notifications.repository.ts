import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import {
  mailPreferences,
  mitigationPlans,
  planTasks,
  registerEntries,
  registerEntryPlants,
  userPlants,
  users,
  type KeelsonDatabase,
} from '@keelson/db';
import { MAIL_KINDS, type MailKind, type PlanStatus, type PlanStrategy, type Role,
  type TaskStatus } from '@keelson/contracts';
import { overdueTaskCondition } from '../plans/overdue-tasks';

/** Someone Keelson may e-mail, with what they switched off. */
export interface MailRecipient {
  id: number;
  email: string;
  name: string;
  role: Role;
  isActive: boolean;
  unsubscribed: MailKind[];
}

/** A plan with its register entry and author, as the e-mails describe it. */
export interface PlanMailContext {
  id: number;
  strategy: PlanStrategy;
  description: string;
  estimatedCost: number | null;
  targetDate: string | null;
  status: PlanStatus;
  whatIf: Record<string, unknown> | null;
  authorId: number | null;
  entry: { id: number; title: string; supplierCode: string; ownerId: number | null };
  /** The plants the entry touches, by code. */
  entryPlants: string[];
}

/** A task with its plan, as the assignment e-mail describes it. */
export interface TaskMailContext {
  id: number;
  title: string;
  dueDate: string | null;
  status: TaskStatus;
  ownerId: number | null;
  plan: PlanMailContext;
}

/** An overdue task of an approved or in-progress plan, for the digest. */
export interface OverdueTaskRow {
  taskId: number;
  title: string;
  dueDate: string;
  status: TaskStatus;
  planId: number;
  strategy: PlanStrategy;
  entryId: number;
  entryTitle: string;
  supplierCode: string;
  owner: { id: number; name: string; isActive: boolean } | null;
}

const recipientColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  isActive: users.isActive,
  unsubscribed: mailPreferences.unsubscribed,
};

type RecipientRow = {
  id: number;
  email: string;
  name: string;
  role: Role;
  isActive: boolean;
  unsubscribed: string[] | null;
};

function toRecipient(row: RecipientRow): MailRecipient {
  const known = new Set<string>(MAIL_KINDS);
  return { ...row, unsubscribed: (row.unsubscribed ?? []).filter(
    (kind): kind is MailKind => known.has(kind)) };
}

/** Drizzle reads of what the notification e-mails say, and writes of mail preferences. */
export class NotificationsRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** The users of `ids` (active or not, so callers can tell why one is skipped). */
  recipients(ids: readonly number[]): MailRecipient[] {
    if (ids.length === 0) return [];
    return this.db.select(recipientColumns).from(users)
      .leftJoin(mailPreferences, eq(mailPreferences.userId, users.id))
      .where(inArray(users.id, [...ids]))
      .orderBy(asc(users.name), asc(users.id))
      .all()
      .map(toRecipient);
  }

  /** Everyone of a role, active or not. */
  recipientsWithRole(role: Role): MailRecipient[] {
    return this.db.select(recipientColumns).from(users)
      .leftJoin(mailPreferences, eq(mailPreferences.userId, users.id))
      .where(eq(users.role, role))
      .orderBy(asc(users.name), asc(users.id))
      .all()
      .map(toRecipient);
  }

  /** Plant managers of any of `plantCodes`, each with the ones of those plants they manage. */
  managersOf(plantCodes: readonly string[]): { recipient: MailRecipient; plants: string[] }[] {
    if (plantCodes.length === 0) return [];
    const rows = this.db.select({ ...recipientColumns, plantCode: userPlants.plantCode })
      .from(userPlants)
      .innerJoin(users, eq(users.id, userPlants.userId))
      .leftJoin(mailPreferences, eq(mailPreferences.userId, users.id))
      .where(and(inArray(userPlants.plantCode, [...plantCodes]), eq(users.role, 'plant_manager')))
      .orderBy(asc(users.name), asc(users.id), asc(userPlants.plantCode))
      .all();
    const byUser = new Map<number, { recipient: MailRecipient; plants: string[] }>();
    for (const { plantCode, ...row } of rows) {
      const found = byUser.get(row.id) ?? { recipient: toRecipient(row), plants: [] };
      found.plants.push(plantCode);
      byUser.set(row.id, found);
    }
    return [...byUser.values()];
  }

  /** A plan with its entry, or undefined when it is gone. */
  plan(planId: number): PlanMailContext | undefined {
    const row = this.db.select({
      id: mitigationPlans.id,
      strategy: mitigationPlans.strategy,
      description: mitigationPlans.description,
      estimatedCost: mitigationPlans.estimatedCost,
      targetDate: mitigationPlans.targetDate,
      status: mitigationPlans.status,
      whatIf: mitigationPlans.whatIf,
      authorId: mitigationPlans.authorId,
      entry: {
        id: registerEntries.id,
        title: registerEntries.title,
        supplierCode: registerEntries.supplierCode,
        ownerId: registerEntries.ownerId,
      },
    }).from(mitigationPlans)
      .innerJoin(registerEntries, eq(registerEntries.id, mitigationPlans.entryId))
      .where(eq(mitigationPlans.id, planId))
      .get();
    if (!row) return undefined;
    const entryPlants = this.db.select({ code: registerEntryPlants.plantCode })
      .from(registerEntryPlants)
      .where(eq(registerEntryPlants.entryId, row.entry.id))
      .orderBy(asc(registerEntryPlants.plantCode))
      .all()
      .map((plant) => plant.code);
    return { ...row, whatIf: row.whatIf ?? null, entryPlants };
  }

  /** A task with its plan, or undefined when either is gone. */
  task(taskId: number): TaskMailContext | undefined {
    const row = this.db.select().from(planTasks).where(eq(planTasks.id, taskId)).get();
    const plan = row && this.plan(row.planId);
    if (!row || !plan) return undefined;
    return { id: row.id, title: row.title, dueDate: row.dueDate, status: row.status,
      ownerId: row.ownerId, plan };
  }

  /**
   * Tasks to do or doing whose due date is before `today` (YYYY-MM-DD), of plans that are
   * approved or in progress; oldest due date first.
   */
  overdueTasks(today: string): OverdueTaskRow[] {
    const owner = alias(users, 'owner');
    return this.db.select({
      taskId: planTasks.id,
      title: planTasks.title,
      dueDate: sql<string>`${planTasks.dueDate}`,
      status: planTasks.status,
      planId: mitigationPlans.id,
      strategy: mitigationPlans.strategy,
      entryId: registerEntries.id,
      entryTitle: registerEntries.title,
      supplierCode: registerEntries.supplierCode,
      ownerId: owner.id,
      ownerName: owner.name,
      ownerIsActive: owner.isActive,
    }).from(planTasks)
      .innerJoin(mitigationPlans, eq(mitigationPlans.id, planTasks.planId))
      .innerJoin(registerEntries, eq(registerEntries.id, mitigationPlans.entryId))
      .leftJoin(owner, eq(owner.id, planTasks.ownerId))
      .where(overdueTaskCondition(today))
      .orderBy(asc(planTasks.dueDate), asc(planTasks.id))
      .all()
      .map(({ ownerId, ownerName, ownerIsActive, ...task }) => ({
        ...task,
        owner: ownerId === null || ownerName === null
          ? null
          : { id: ownerId, name: ownerName, isActive: ownerIsActive ?? false },
      }));
  }

  /** The kinds a user switched off (none when they never saved a choice). */
  unsubscribedOf(userId: number): MailKind[] {
    const row = this.db.select({ unsubscribed: mailPreferences.unsubscribed })
      .from(mailPreferences).where(eq(mailPreferences.userId, userId)).get();
    return toRecipient({ id: userId, email: '', name: '', role: 'viewer', isActive: true,
      unsubscribed: row?.unsubscribed ?? null }).unsubscribed;
  }

  /** Stores the kinds a user switched off (insert or replace). */
  saveUnsubscribed(userId: number, unsubscribed: readonly MailKind[], now: Date): void {
    const values = { userId, unsubscribed: [...unsubscribed], updatedAt: now.toISOString() };
    this.db.insert(mailPreferences).values(values)
      .onConflictDoUpdate({ target: mailPreferences.userId,
        set: { unsubscribed: values.unsubscribed, updatedAt: values.updatedAt } })
      .run();
  }
}
