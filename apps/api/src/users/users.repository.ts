import { and, asc, count, desc, eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import {
  userPlants,
  users,
  type KeelsonDatabase,
  type NewUserRow,
  type UserRow,
} from '@keelson/db';
import type { ListUsersQuery, Role, UserSortField } from '@keelson/contracts';
import { recordAudit, type AuditEvent } from '../audit/audit-trail';

/** Changes {@link UsersRepository.update} can make. */
export type UserChanges = Partial<
  Pick<UserRow, 'name' | 'role' | 'isActive' | 'passwordHash' | 'lastLoginAt'>
> & { updatedAt: string };

const SORT_COLUMNS = {
  name: users.name,
  email: users.email,
  role: users.role,
  createdAt: users.createdAt,
  lastLoginAt: users.lastLoginAt,
} satisfies Record<UserSortField, unknown>;

/** Escapes LIKE wildcards so a search for `50%` finds the text `50%`. */
function likePattern(text: string): string {
  return `%${text.toLowerCase().replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** Drizzle access to `users` and `user_plants`. */
export class UsersRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** The user with `id`, if any. */
  findById(id: number): UserRow | undefined {
    return this.db.select().from(users).where(eq(users.id, id)).get();
  }

  /** The user with this (lower-case) e-mail address, if any. */
  findByEmail(email: string): UserRow | undefined {
    return this.db.select().from(users).where(eq(users.email, email.toLowerCase())).get();
  }

  /** Number of users; 0 means a fresh workspace. */
  countAll(): number {
    return this.db.select({ value: count() }).from(users).get()?.value ?? 0;
  }

  /** A filtered, sorted page of users and the total matching the filter. */
  list(query: ListUsersQuery): { rows: UserRow[]; total: number } {
    const conditions: SQL[] = [];
    if (query.q) {
      const pattern = likePattern(query.q);
      conditions.push(
        or(
          sql`lower(${users.name}) like ${pattern} escape '\\'`,
          sql`${users.email} like ${pattern} escape '\\'`,
        )!,
      );
    }
    if (query.role) {
      conditions.push(eq(users.role, query.role));
    }
    const where = conditions.length > 0 ? and(...conditions) : undefined;
    const column = SORT_COLUMNS[query.sort];
    const direction = query.order === 'desc' ? desc : asc;
    // Nulls (never signed in) sort last either way; the id keeps pages stable.
    const rows = this.db
      .select()
      .from(users)
      .where(where)
      .orderBy(sql`${column} is null`, direction(column), asc(users.id))
      .limit(query.limit)
      .offset(query.offset)
      .all();
    const total = this.db.select({ value: count() }).from(users).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** Inserts a user and returns the stored row. */
  insert(row: NewUserRow): UserRow {
    return this.db
      .insert(users)
      .values({ ...row, email: row.email.toLowerCase() })
      .returning()
      .get();
  }

  /** Applies `changes` to the user and returns the stored row. */
  update(id: number, changes: UserChanges): UserRow | undefined {
    return this.db.update(users).set(changes).where(eq(users.id, id)).returning().get();
  }

  /** Plant codes per user, for the given users (sorted). */
  plantCodesOf(userIds: readonly number[]): Map<number, string[]> {
    const result = new Map<number, string[]>(userIds.map((id) => [id, []]));
    if (userIds.length === 0) {
      return result;
    }
    const rows = this.db
      .select()
      .from(userPlants)
      .where(inArray(userPlants.userId, [...userIds]))
      .orderBy(asc(userPlants.plantCode))
      .all();
    for (const row of rows) {
      result.get(row.userId)?.push(row.plantCode);
    }
    return result;
  }

  /** Replaces the user's plants with `plantCodes`. */
  replacePlants(userId: number, plantCodes: readonly string[]): void {
    this.db.delete(userPlants).where(eq(userPlants.userId, userId)).run();
    if (plantCodes.length > 0) {
      this.db
        .insert(userPlants)
        .values(plantCodes.map((plantCode) => ({ userId, plantCode })))
        .run();
    }
  }

  /** Active users with `role` (for checks such as "the last administrator"). */
  countActiveWithRole(role: Role): number {
    return (
      this.db
        .select({ value: count() })
        .from(users)
        .where(and(eq(users.role, role), eq(users.isActive, true)))
        .get()?.value ?? 0
    );
  }

  /** Appends a user or role change to the audit trail (call it inside {@link transaction}). */
  audit(event: AuditEvent, now: Date): void {
    recordAudit(this.db, event, now);
  }

  /** Runs `work` in one transaction (better-sqlite3 transactions are synchronous). */
  transaction<T>(work: () => T): T {
    return this.db.transaction(() => work());
  }
}
