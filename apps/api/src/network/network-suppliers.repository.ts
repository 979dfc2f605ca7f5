import { and, asc, count, desc, eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { ListSuppliersQuery, SupplierSortField } from '@keelson/contracts';
import {
  networkPlants,
  networkSourcing,
  networkSupplierPlants,
  networkSuppliers,
  type KeelsonDatabase,
  type NetworkSupplierRow,
} from '@keelson/db';
import { contains, nullsLast, servesAnyOf, valueList } from './network-sql';
import type { PlantScope } from './plant-scope';

/** A sourcing row joined with the names of both ends. */
export interface SourcingLinkRecord {
  buyerCode: string;
  buyerKind: 'plant' | 'supplier';
  buyerName: string;
  itemCode: string;
  supplierCode: string;
  supplierName: string;
  sharePct: number | null;
  isQualified: boolean;
  qualifiedSources: number;
  row: number | null;
}

/** The supplier list's filters once the service has applied the plant scope. */
export interface SupplierFilter extends Omit<ListSuppliersQuery, 'plant'> {
  /** Suppliers serving one of these plants; null for no plant condition. */
  plants: PlantScope;
}

const buyerSupplier = alias(networkSuppliers, 'buyer_supplier');
const sellerSupplier = alias(networkSuppliers, 'seller_supplier');
const s = networkSuppliers;
const r = networkSourcing;

/**
 * Sourcing rows of the outer supplier `s` as seller, counted in the plant scope: rows bought by
 * one of the plants, or by a supplier that serves one of them.
 */
function sellsCountSql(versionId: number, scope: PlantScope): SQL {
  return sql`(select count(*) from network_sourcing sr where sr.version_id = ${s.versionId}
    and sr.supplier_code = ${s.code}${scopedBuyer(versionId, sql`sr.buyer_code`, scope)})`;
}

function buysCountSql(): SQL {
  return sql`(select count(*) from network_sourcing br where br.version_id = ${s.versionId}
    and br.buyer_code = ${s.code})`;
}

/** ` and <buyer is in scope>` or nothing for an unscoped user. */
function scopedBuyer(versionId: number, buyerCode: SQL, scope: PlantScope): SQL {
  if (scope === null) return sql``;
  if (scope.length === 0) return sql` and 0`;
  return sql` and (${buyerCode} in ${valueList(scope)}
    or ${servesAnyOf(versionId, buyerCode, scope)})`;
}

/** How to order by each sort field: its key, and whether nulls go last first. */
type SortKey = (versionId: number, scope: PlantScope) => { key: SQL; isNullable?: true };
const SORT_KEYS: Record<SupplierSortField, SortKey> = {
  code: () => ({ key: sql`${s.code}` }),
  name: () => ({ key: sql`${s.name} collate nocase` }),
  country: () => ({ key: sql`${s.country}` }),
  region: () => ({ key: sql`${s.region} collate nocase` }),
  tier: () => ({ key: sql`${s.tier}`, isNullable: true }),
  recoveryWeeks: () => ({ key: sql`${s.recoveryWeeks}` }),
  financialHealth: () => ({ key: sql`${s.financialHealth}`, isNullable: true }),
  deliveryScore: () => ({ key: sql`${s.deliveryScore}`, isNullable: true }),
  hasContinuityPlan: () => ({ key: sql`${s.hasContinuityPlan}`, isNullable: true }),
  sellsCount: (versionId, scope) => ({ key: sellsCountSql(versionId, scope) }),
  buysCount: () => ({ key: buysCountSql() }),
};

/** Drizzle access to a version's suppliers, the plants they serve and their sourcing rows. */
export class NetworkSuppliersRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /**
   * A filtered, sorted page of suppliers and the number matching, all in SQL: the search and
   * filters run on the version's rows through its indexes, and only one page is read.
   */
  list(versionId: number, filter: SupplierFilter, scope: PlantScope) {
    const conditions: SQL[] = [eq(s.versionId, versionId)];
    if (filter.q) conditions.push(or(contains(s.code, filter.q), contains(s.name, filter.q))!);
    if (filter.tier !== undefined) conditions.push(eq(s.tier, filter.tier));
    if (filter.country) conditions.push(eq(s.country, filter.country));
    if (filter.region) conditions.push(sql`${s.region} = ${filter.region} collate nocase`);
    if (filter.plants !== null) conditions.push(servesAnyOf(versionId, s.code, filter.plants));
    const where = and(...conditions);
    const direction = filter.order === 'desc' ? desc : asc;
    const { key, isNullable } = SORT_KEYS[filter.sort](versionId, scope);
    // Nulls (not given in the file) sort last in both directions; the code keeps pages stable.
    const keys = isNullable ? [nullsLast(key), direction(key)] : [direction(key)];
    const rows = this.db
      .select()
      .from(s)
      .where(where)
      .orderBy(...keys, asc(s.code))
      .limit(filter.limit)
      .offset(filter.offset)
      .all();
    const total = this.db.select({ value: count() }).from(s).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** One supplier of the version, if it exists. */
  find(versionId: number, code: string): NetworkSupplierRow | undefined {
    return this.db.select().from(s).where(and(eq(s.versionId, versionId), eq(s.code, code))).get();
  }

  /** Whether the supplier serves one of the plants. */
  servesAny(versionId: number, code: string, plants: readonly string[]): boolean {
    if (plants.length === 0) return false;
    const row = this.db
      .select({ code: networkSupplierPlants.supplierCode })
      .from(networkSupplierPlants)
      .where(and(
        eq(networkSupplierPlants.versionId, versionId),
        eq(networkSupplierPlants.supplierCode, code),
        inArray(networkSupplierPlants.plantCode, [...plants]),
      ))
      .limit(1)
      .get();
    return row !== undefined;
  }

  /** Plants each supplier serves, in code order, within the scope. */
  plantsOf(versionId: number, codes: readonly string[], scope: PlantScope) {
    const result = new Map<string, string[]>(codes.map((code) => [code, []]));
    if (codes.length === 0 || scope?.length === 0) return result;
    const sp = networkSupplierPlants;
    const conditions = [eq(sp.versionId, versionId), inArray(sp.supplierCode, [...codes])];
    if (scope !== null) conditions.push(inArray(sp.plantCode, [...scope]));
    const rows = this.db.select().from(sp).where(and(...conditions))
      .orderBy(asc(sp.supplierCode), asc(sp.plantCode)).all();
    for (const row of rows) result.get(row.supplierCode)?.push(row.plantCode);
    return result;
  }

  /** Sourcing rows in which each supplier sells (in the scope) and buys. */
  sourcingCounts(versionId: number, codes: readonly string[], scope: PlantScope) {
    const result = new Map(codes.map((code) => [code, { sells: 0, buys: 0 }]));
    if (codes.length === 0) return result;
    const sells = this.db
      .select({ code: r.supplierCode, value: count() })
      .from(r)
      .where(sql`${r.versionId} = ${versionId} and ${inArray(r.supplierCode, [...codes])}${
        scopedBuyer(versionId, sql`${r.buyerCode}`, scope)}`)
      .groupBy(r.supplierCode)
      .all();
    const buys = this.db
      .select({ code: r.buyerCode, value: count() })
      .from(r)
      .where(and(eq(r.versionId, versionId), inArray(r.buyerCode, [...codes])))
      .groupBy(r.buyerCode)
      .all();
    for (const row of sells) result.get(row.code)!.sells = row.value;
    for (const row of buys) result.get(row.code)!.buys = row.value;
    return result;
  }

  /** Rows in which the supplier sells, within the scope, in spreadsheet order. */
  sells(versionId: number, code: string, scope: PlantScope): SourcingLinkRecord[] {
    return this.links(sql`${r.versionId} = ${versionId} and ${r.supplierCode} = ${code}${
      scopedBuyer(versionId, sql`${r.buyerCode}`, scope)}`);
  }

  /** Rows in which the supplier buys, in spreadsheet order. */
  buys(versionId: number, code: string): SourcingLinkRecord[] {
    return this.links(and(eq(r.versionId, versionId), eq(r.buyerCode, code))!);
  }

  /** Rows in which `buyerCode` buys `itemCode`, in spreadsheet order. */
  sourcesOf(versionId: number, buyerCode: string, itemCode: string): SourcingLinkRecord[] {
    return this.links(and(
      eq(r.versionId, versionId), eq(r.buyerCode, buyerCode), eq(r.itemCode, itemCode))!);
  }

  /** Sourcing rows matching `where`, with both ends named and the item's qualified sources. */
  private links(where: SQL): SourcingLinkRecord[] {
    const rows = this.db
      .select({
        buyerCode: r.buyerCode,
        plantName: networkPlants.name,
        buyerSupplierName: buyerSupplier.name,
        itemCode: r.itemCode,
        supplierCode: r.supplierCode,
        supplierName: sellerSupplier.name,
        sharePct: r.sharePct,
        isQualified: r.isQualified,
        qualifiedSources: sql<number>`(select count(*) from network_sourcing q
          where q.version_id = ${r.versionId} and q.buyer_code = ${r.buyerCode}
          and q.item_code = ${r.itemCode} and q.is_qualified = 1)`,
        row: r.row,
      })
      .from(r)
      .leftJoin(networkPlants, and(
        eq(networkPlants.versionId, r.versionId), eq(networkPlants.code, r.buyerCode)))
      .leftJoin(buyerSupplier, and(
        eq(buyerSupplier.versionId, r.versionId), eq(buyerSupplier.code, r.buyerCode)))
      .leftJoin(sellerSupplier, and(
        eq(sellerSupplier.versionId, r.versionId), eq(sellerSupplier.code, r.supplierCode)))
      .where(where)
      .orderBy(nullsLast(r.row), asc(r.row), asc(r.id))
      .all();
    return rows.map(({ plantName, buyerSupplierName, supplierName, ...rest }) => ({
      ...rest,
      buyerKind: plantName !== null ? 'plant' : 'supplier',
      buyerName: plantName ?? buyerSupplierName ?? rest.buyerCode,
      supplierName: supplierName ?? rest.supplierCode,
    }));
  }
}
