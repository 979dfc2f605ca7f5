import { asc, count, eq } from 'drizzle-orm';
import { countries, users, type CountryRow, type KeelsonDatabase } from '@keelson/db';

/** A country row with the name of who last changed it. */
export interface CountryRecord extends CountryRow {
  updatedByName: string | null;
}

/** Changes {@link CountriesRepository.update} makes. */
export type CountryChanges = Partial<Pick<CountryRow, 'name' | 'region'>> &
  Pick<CountryRow, 'hazard' | 'isDefault' | 'updatedAt' | 'updatedBy'>;

/** Drizzle access to `countries`. */
export class CountriesRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Every country, by code, with the updater's name. */
  list(): CountryRecord[] {
    return this.select().orderBy(asc(countries.code)).all();
  }

  /** One country, if it exists. */
  find(code: string): CountryRecord | undefined {
    return this.select().where(eq(countries.code, code)).get();
  }

  /** Number of rows; 0 means the table has never been seeded. */
  countAll(): number {
    return this.db.select({ value: count() }).from(countries).get()?.value ?? 0;
  }

  /** Inserts rows (a synchronous multi-row INSERT). */
  insert(rows: readonly CountryRow[]): void {
    if (rows.length > 0) this.db.insert(countries).values([...rows]).run();
  }

  /** Applies `changes` to one country. */
  update(code: string, changes: CountryChanges): void {
    this.db.update(countries).set(changes).where(eq(countries.code, code)).run();
  }

  /** Runs `work` in one transaction. */
  transaction<T>(work: () => T): T {
    return this.db.transaction(() => work());
  }

  private select() {
    return this.db
      .select({
        code: countries.code,
        name: countries.name,
        region: countries.region,
        hazard: countries.hazard,
        isDefault: countries.isDefault,
        updatedAt: countries.updatedAt,
        updatedBy: countries.updatedBy,
        updatedByName: users.name,
      })
      .from(countries)
      .leftJoin(users, eq(users.id, countries.updatedBy))
      .$dynamic();
  }
}
