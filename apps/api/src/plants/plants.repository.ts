import { and, asc, eq, inArray } from 'drizzle-orm';
import { plants, userPlants, users, type KeelsonDatabase, type PlantRow } from '@keelson/db';
import type { PlantManagerDto } from '@keelson/contracts';

/** Drizzle access to `plants` and the managers linked through `user_plants`. */
export class PlantsRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Every plant, by code. */
  list(): PlantRow[] {
    return this.db.select().from(plants).orderBy(asc(plants.code)).all();
  }

  /** One plant, if it exists. */
  find(code: string): PlantRow | undefined {
    return this.db.select().from(plants).where(eq(plants.code, code)).get();
  }

  /** Which of `codes` exist. */
  existingCodes(codes: readonly string[]): Set<string> {
    if (codes.length === 0) {
      return new Set();
    }
    const rows = this.db
      .select({ code: plants.code })
      .from(plants)
      .where(inArray(plants.code, [...codes]))
      .all();
    return new Set(rows.map((row) => row.code));
  }

  /** Active plant managers of the plant, by name. */
  managersOf(code: string): PlantManagerDto[] {
    return this.db
      .select({ id: users.id, name: users.name, email: users.email })
      .from(userPlants)
      .innerJoin(users, eq(users.id, userPlants.userId))
      .where(
        and(
          eq(userPlants.plantCode, code),
          eq(users.role, 'plant_manager'),
          eq(users.isActive, true),
        ),
      )
      .orderBy(asc(users.name))
      .all();
  }

  /** Inserts plants that do not exist yet (by code). */
  insertMissing(rows: readonly PlantRow[]): void {
    if (rows.length > 0) {
      this.db.insert(plants).values([...rows]).onConflictDoNothing().run();
    }
  }
}
