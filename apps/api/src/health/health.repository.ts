import { sql } from 'drizzle-orm';
import type { KeelsonDatabase } from '@keelson/db';

/** The database check behind the health route. */
export class HealthRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** True when the database answers a trivial query. */
  ping(): boolean {
    try {
      return this.db.get<{ ok: number }>(sql`select 1 as ok`)?.ok === 1;
    } catch {
      return false;
    }
  }
}
