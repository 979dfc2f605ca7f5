/**
 * Drizzle access to the register: entries with their supplier's name (from the latest network
 * version), owner, plants and override history; the run rows and network rows a manual entry
 * takes its scores from.
 */
import {
  and, asc, count, desc, eq, inArray, isNotNull, sql, type SQL, type SQLWrapper,
} from 'drizzle-orm';
import type { ExportRegisterQuery, RegisterSortField } from '@keelson/contracts';
import {
  analysisRuns,
  likelihoodOverrides,
  networkSupplierPlants,
  networkSuppliers,
  registerEntries,
  registerEntryPlants,
  runSuppliers,
  users,
  type KeelsonDatabase,
  type NetworkSupplierRow,
  type RegisterEntryRow,
  type RunSupplierRow,
} from '@keelson/db';
import { contains, valueList } from '../network/network-sql';
import type { PlantScope } from '../network/plant-scope';

/** An entry row with the names the DTO shows. */
export interface RegisterEntryRecord extends RegisterEntryRow {
  supplierName: string | null;
  ownerName: string | null;
}

/** An override row with the name of who made it. */
export interface LikelihoodOverrideRecord {
  id: number;
  entryId: number;
  likelihood: number | null;
  previous: number | null;
  reason: string;
  userId: number | null;
  userName: string | null;
  createdAt: string;
}

/** The list's filters once the service has applied the plant scope. */
export interface RegisterFilter extends Omit<ExportRegisterQuery, 'plant'> {
  /** Entries with one of these plants; null for no plant condition. */
  plants: PlantScope;
}

const e = registerEntries;
const effectiveLikelihood = sql`coalesce(${e.likelihoodOverride}, ${e.computedLikelihood})`;
const SORT_COLUMNS: Record<RegisterSortField, SQLWrapper> = {
  id: e.id,
  title: sql`lower(${e.title})`,
  supplierCode: e.supplierCode,
  status: e.status,
  likelihood: effectiveLikelihood,
  impactBand: e.impactBand,
  rating: e.rating,
  updatedAt: e.updatedAt,
};

/** Drizzle access to `register_entries` and its satellite tables. */
export class RegisterRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** A filtered, sorted page of entries (all of them when `page` is omitted) and the total. */
  list(
    versionId: number | null,
    filter: RegisterFilter,
    page?: { limit: number; offset: number },
  ): { rows: RegisterEntryRecord[]; total: number } {
    const where = this.conditions(versionId, filter);
    const column = SORT_COLUMNS[filter.sort];
    const direction = filter.order === 'desc' ? desc : asc;
    let query = this.selectEntries(versionId).where(where)
      .orderBy(direction(column), asc(e.id)).$dynamic();
    if (page) query = query.limit(page.limit).offset(page.offset);
    const rows = query.all();
    // The supplier join matters to the count only when the search may match a supplier name.
    const counted = this.db.select({ value: count() }).from(e).$dynamic();
    const total = (filter.q ? counted.leftJoin(networkSuppliers, this.supplierJoin(versionId))
      : counted).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** One entry with names, if it exists. */
  find(versionId: number | null, id: number): RegisterEntryRecord | undefined {
    return this.selectEntries(versionId).where(eq(e.id, id)).get();
  }

  /** Plant codes per entry id, sorted. */
  plantsOf(entryIds: readonly number[]): Map<number, string[]> {
    const plants = new Map<number, string[]>(entryIds.map((id) => [id, []]));
    if (entryIds.length === 0) return plants;
    for (const ids of chunksOf(entryIds)) {
      const rows = this.db.select().from(registerEntryPlants)
        .where(inArray(registerEntryPlants.entryId, ids))
        .orderBy(asc(registerEntryPlants.plantCode)).all();
      for (const row of rows) plants.get(row.entryId)?.push(row.plantCode);
    }
    return plants;
  }

  /** The override history of entries, oldest first, with who made each one. */
  overridesOf(entryIds: readonly number[]): LikelihoodOverrideRecord[] {
    return chunksOf(entryIds).flatMap((ids) => this.db
      .select({ id: likelihoodOverrides.id, entryId: likelihoodOverrides.entryId,
        likelihood: likelihoodOverrides.likelihood, previous: likelihoodOverrides.previous,
        reason: likelihoodOverrides.reason, userId: likelihoodOverrides.userId,
        userName: users.name, createdAt: likelihoodOverrides.createdAt })
      .from(likelihoodOverrides)
      .leftJoin(users, eq(users.id, likelihoodOverrides.userId))
      .where(inArray(likelihoodOverrides.entryId, ids))
      .orderBy(asc(likelihoodOverrides.id))
      .all());
  }

  /** Inserts an entry with its plants and returns its id. */
  insert(row: typeof e.$inferInsert, plants: readonly string[]): number {
    const { id } = this.db.insert(e).values(row).returning({ id: e.id }).get();
    this.replacePlants(id, plants);
    return id;
  }

  /** Applies changes to one entry. */
  update(id: number, changes: Partial<typeof e.$inferInsert>): void {
    this.db.update(e).set(changes).where(eq(e.id, id)).run();
  }

  /** Every entry's scoring inputs, for re-scoring after a settings change. */
  scoringInputs(): Pick<RegisterEntryRow, 'id' | 'computedLikelihood' | 'likelihoodOverride'
    | 'impactBand' | 'rating' | 'ratingBand'>[] {
    return this.db.select({ id: e.id, computedLikelihood: e.computedLikelihood,
      likelihoodOverride: e.likelihoodOverride, impactBand: e.impactBand, rating: e.rating,
      ratingBand: e.ratingBand }).from(e).all();
  }

  /** Appends one row to an entry's override history. */
  insertOverride(row: typeof likelihoodOverrides.$inferInsert): void {
    this.db.insert(likelihoodOverrides).values(row).run();
  }

  /** Replaces an entry's plants. */
  replacePlants(entryId: number, plants: readonly string[]): void {
    this.db.delete(registerEntryPlants).where(eq(registerEntryPlants.entryId, entryId)).run();
    const unique = [...new Set(plants)];
    if (unique.length > 0) {
      this.db.insert(registerEntryPlants)
        .values(unique.map((plantCode) => ({ entryId, plantCode }))).run();
    }
  }

  /** A supplier of a network version, if it is one. */
  supplier(versionId: number, code: string): NetworkSupplierRow | undefined {
    return this.db.select().from(networkSuppliers)
      .where(and(eq(networkSuppliers.versionId, versionId), eq(networkSuppliers.code, code)))
      .get();
  }

  /** The plants a supplier of a version serves, directly or through other suppliers. */
  servedPlants(versionId: number, code: string): string[] {
    return this.db.select({ plantCode: networkSupplierPlants.plantCode })
      .from(networkSupplierPlants)
      .where(and(eq(networkSupplierPlants.versionId, versionId),
        eq(networkSupplierPlants.supplierCode, code)))
      .orderBy(asc(networkSupplierPlants.plantCode)).all().map((row) => row.plantCode);
  }

  /**
   * The fewest qualified alternatives of a supplier of a version: over every (item, buyer) it is
   * a qualified source of, the number of other qualified sources; null when it sells nothing
   * qualified. The same number as `fewestAlternativesBySupplier` of `@keelson/scoring`, for one
   * supplier, without reading the whole network.
   */
  fewestAlternatives(versionId: number, code: string): number | null {
    const row = this.db.get<{ fewest: number | null }>(sql`select min((select
        count(distinct o.supplier_code) from network_sourcing o
        where o.version_id = s.version_id and o.buyer_code = s.buyer_code
          and o.item_code = s.item_code and o.is_qualified = 1) - 1) as fewest
      from network_sourcing s
      where s.version_id = ${versionId} and s.supplier_code = ${code} and s.is_qualified = 1`);
    return row?.fewest ?? null;
  }

  /** The supplier's row in the most recently finished succeeded run that has it. */
  latestRunRow(code: string): RunSupplierRow | undefined {
    return this.db.select({ row: runSuppliers }).from(runSuppliers)
      .innerJoin(analysisRuns, eq(analysisRuns.id, runSuppliers.runId))
      .where(and(eq(runSuppliers.code, code), eq(analysisRuns.status, 'succeeded')))
      .orderBy(desc(analysisRuns.finishedAt), desc(analysisRuns.id))
      .limit(1).get()?.row;
  }

  /** A user's name and whether they are active, if the user exists. */
  user(id: number): { id: number; name: string; isActive: boolean } | undefined {
    return this.db.select({ id: users.id, name: users.name, isActive: users.isActive })
      .from(users).where(eq(users.id, id)).get();
  }

  /** Every active user, by name. */
  activeUsers(): { id: number; name: string; role: string }[] {
    return this.db.select({ id: users.id, name: users.name, role: users.role }).from(users)
      .where(eq(users.isActive, true)).orderBy(asc(users.name), asc(users.id)).all();
  }

  /** Runs `work` in one transaction (better-sqlite3 transactions are synchronous). */
  transaction<T>(work: () => T): T {
    return this.db.transaction(() => work());
  }

  private selectEntries(versionId: number | null) {
    return this.db.select({ ...entryColumns, supplierName: networkSuppliers.name,
      ownerName: users.name })
      .from(e)
      .leftJoin(networkSuppliers, this.supplierJoin(versionId))
      .leftJoin(users, eq(users.id, e.ownerId));
  }

  private supplierJoin(versionId: number | null): SQL {
    // No version yet: join nothing, so names are null rather than from an arbitrary version.
    return and(eq(networkSuppliers.versionId, versionId ?? -1),
      eq(networkSuppliers.code, e.supplierCode))!;
  }

  private conditions(versionId: number | null, filter: RegisterFilter): SQL | undefined {
    const conditions: SQL[] = [];
    if (filter.plants !== null) {
      conditions.push(filter.plants.length === 0 ? sql`0` : sql`${e.id} in (select p.entry_id
        from register_entry_plants p where p.plant_code in ${valueList(filter.plants)})`);
    }
    if (filter.q) {
      const q = filter.q;
      conditions.push(sql`(${contains(e.title, q)} or ${contains(e.supplierCode, q)}
        or ${versionId === null ? sql`0` : contains(networkSuppliers.name, q)})`);
    }
    if (filter.status) conditions.push(eq(e.status, filter.status));
    if (filter.ratingBand) conditions.push(eq(e.ratingBand, filter.ratingBand));
    if (filter.ownerId) conditions.push(eq(e.ownerId, filter.ownerId));
    if (filter.flag === 'flagged') conditions.push(isNotNull(e.flag));
    else if (filter.flag) conditions.push(eq(e.flag, filter.flag));
    return conditions.length > 0 ? and(...conditions) : undefined;
  }
}

// Well below SQLite's limit of bound parameters per statement (32 766).
const ID_CHUNK = 10_000;

/** `ids` in slices of at most {@link ID_CHUNK}, so an export of any size binds few parameters. */
function chunksOf(ids: readonly number[]): number[][] {
  const chunks: number[][] = [];
  for (let start = 0; start < ids.length; start += ID_CHUNK) {
    chunks.push(ids.slice(start, start + ID_CHUNK));
  }
  return chunks;
}

const entryColumns = {
  id: e.id, supplierCode: e.supplierCode, title: e.title, origin: e.origin, status: e.status,
  ownerId: e.ownerId, runId: e.runId, computedLikelihood: e.computedLikelihood,
  likelihoodOverride: e.likelihoodOverride, impactBand: e.impactBand, rating: e.rating,
  ratingBand: e.ratingBand, notes: e.notes, createdBy: e.createdBy, createdAt: e.createdAt,
  updatedAt: e.updatedAt, flag: e.flag,
};
