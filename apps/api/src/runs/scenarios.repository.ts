/** Drizzle access to saved scenarios (`scenarios`). */
import { asc, eq } from 'drizzle-orm';
import { scenarios, users, type KeelsonDatabase } from '@keelson/db';

/** A stored scenario with its creator's name. */
export type ScenarioRecord = typeof scenarios.$inferSelect & { createdByName: string | null };

/** What a scenario holds. */
export type ScenarioValues = Pick<typeof scenarios.$inferInsert,
  'name' | 'description' | 'suppliers' | 'countries' | 'regions'>;

/** Reads and writes saved scenarios. */
export class ScenariosRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Every scenario, by name. */
  list(): ScenarioRecord[] {
    return this.select().orderBy(asc(scenarios.name), asc(scenarios.id)).all();
  }

  /** One scenario. */
  find(id: number): ScenarioRecord | undefined {
    return this.select().where(eq(scenarios.id, id)).get();
  }

  /** The scenario called `name`, if any. */
  findByName(name: string): { id: number } | undefined {
    return this.db.select({ id: scenarios.id }).from(scenarios)
      .where(eq(scenarios.name, name)).get();
  }

  /** Inserts a scenario; returns its id. */
  insert(values: ScenarioValues & { createdBy: number | null; createdAt: string }): number {
    return this.db.insert(scenarios).values({ ...values, updatedAt: values.createdAt })
      .returning({ id: scenarios.id }).get().id;
  }

  /** Replaces a scenario's content. */
  update(id: number, values: ScenarioValues & { updatedAt: string }): void {
    this.db.update(scenarios).set(values).where(eq(scenarios.id, id)).run();
  }

  /** Deletes a scenario; false when there was none. */
  delete(id: number): boolean {
    return this.db.delete(scenarios).where(eq(scenarios.id, id)).run().changes > 0;
  }

  private select() {
    return this.db
      .select({
        id: scenarios.id,
        name: scenarios.name,
        description: scenarios.description,
        suppliers: scenarios.suppliers,
        countries: scenarios.countries,
        regions: scenarios.regions,
        createdBy: scenarios.createdBy,
        createdAt: scenarios.createdAt,
        updatedAt: scenarios.updatedAt,
        createdByName: users.name,
      })
      .from(scenarios)
      .leftJoin(users, eq(users.id, scenarios.createdBy))
      .$dynamic();
  }
}
