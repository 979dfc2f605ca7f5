import { and, asc, count, desc, eq, or, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import type {
  ItemSortField,
  ListItemsQuery,
  ListProductsQuery,
  ProductSortField,
} from '@keelson/contracts';
import {
  networkBomLines,
  networkItems,
  networkPlants,
  networkProducts,
  type KeelsonDatabase,
} from '@keelson/db';
import { contains, nullsLast, servesAnyOf, valueList } from './network-sql';
import type { PlantScope } from './plant-scope';

/** The product list's filters once the plant scope is applied. */
export interface ProductFilter extends Omit<ListProductsQuery, 'plant'> {
  /** Products of these plants; null for all. */
  plants: PlantScope;
}

/** The item list's filters once the plant scope is applied. */
export interface ItemFilter extends Omit<ListItemsQuery, 'plant'> {
  /** Items held by these plants or by suppliers serving them; null for all. */
  plants: PlantScope;
}

/** An item at one holder, as stored. */
export type ItemRecord = typeof networkItems.$inferSelect;

const p = networkProducts;
const i = networkItems;
const b = networkBomLines;

const componentCountSql = sql<number>`(select count(*) from network_bom_lines bl
  where bl.version_id = ${p.versionId} and bl.parent_code = ${p.code})`;

const PRODUCT_SORT_KEYS: Record<ProductSortField, SQL> = {
  code: sql`${p.code}`,
  name: sql`${p.name} collate nocase`,
  plantCode: sql`${p.plantCode}`,
  weeklyRevenue: sql`${p.weeklyRevenue}`,
  componentCount: componentCountSql,
};

const ITEM_SORT_KEYS: Record<ItemSortField, SQL> = {
  code: sql`${i.code}`,
  holderCode: sql`${i.holderCode}`,
  holderKind: sql`${i.holderKind}`,
  kind: sql`${i.kind}`,
  qualifiedSources: sql`${i.qualifiedSources}`,
  weeksOfCover: sql`${i.weeksOfCover}`,
  usedIn: sql`${i.usedIn}`,
};

/** Drizzle access to a version's plants, products, items and bill of materials. */
export class NetworkCatalogRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** A filtered, sorted page of products with their direct BOM line counts. */
  listProducts(versionId: number, filter: ProductFilter) {
    const conditions: SQL[] = [eq(p.versionId, versionId)];
    if (filter.q) conditions.push(or(contains(p.code, filter.q), contains(p.name, filter.q))!);
    if (filter.plants !== null) conditions.push(inPlants(p.plantCode, filter.plants));
    const where = and(...conditions);
    const direction = filter.order === 'desc' ? desc : asc;
    const rows = this.db
      .select({
        code: p.code, name: p.name, plantCode: p.plantCode, weeklyRevenue: p.weeklyRevenue,
        componentCount: componentCountSql, row: p.row,
      })
      .from(p)
      .where(where)
      .orderBy(direction(PRODUCT_SORT_KEYS[filter.sort]), asc(p.code))
      .limit(filter.limit)
      .offset(filter.offset)
      .all();
    const total = this.db.select({ value: count() }).from(p).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** A filtered, sorted page of items (one row per item and holder). */
  listItems(versionId: number, filter: ItemFilter) {
    const conditions: SQL[] = [eq(i.versionId, versionId)];
    if (filter.q) conditions.push(contains(i.code, filter.q));
    if (filter.kind) conditions.push(eq(i.kind, filter.kind));
    if (filter.singleSourced !== undefined) {
      const single = sql`(${i.kind} = 'bought' and ${i.qualifiedSources} <= 1)`;
      conditions.push(filter.singleSourced === 'true' ? single : sql`not ${single}`);
    }
    if (filter.plants !== null) {
      conditions.push(or(
        and(eq(i.holderKind, 'plant'), inPlants(i.holderCode, filter.plants)),
        and(eq(i.holderKind, 'supplier'), servesAnyOf(versionId, i.holderCode, filter.plants)),
      )!);
    }
    const where = and(...conditions);
    const direction = filter.order === 'desc' ? desc : asc;
    const key = ITEM_SORT_KEYS[filter.sort];
    // Cover is null for made items and items at suppliers: those sort last either way.
    const keys =
      filter.sort === 'weeksOfCover' ? [nullsLast(key), direction(key)] : [direction(key)];
    const rows = this.db
      .select()
      .from(i)
      .where(where)
      .orderBy(...keys, asc(i.code), asc(i.holderCode))
      .limit(filter.limit)
      .offset(filter.offset)
      .all();
    const total = this.db.select({ value: count() }).from(i).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** One product of the version, if it exists. */
  findProduct(versionId: number, code: string) {
    return this.db.select().from(p).where(and(eq(p.versionId, versionId), eq(p.code, code))).get();
  }

  /** One plant of the version, if it exists. */
  findPlant(versionId: number, code: string) {
    return this.db.select().from(networkPlants)
      .where(and(eq(networkPlants.versionId, versionId), eq(networkPlants.code, code))).get();
  }

  /** The plants at which an item is made or bought (holder kind plant), by plant code. */
  itemAtPlants(versionId: number, code: string): ItemRecord[] {
    return this.db.select().from(i)
      .where(and(eq(i.versionId, versionId), eq(i.code, code), eq(i.holderKind, 'plant')))
      .orderBy(asc(i.holderCode))
      .all();
  }

  /**
   * The direct BOM children of `parentCode` with what the item rows say of each at the plant
   * (kind, qualified sources, cover), in spreadsheet order.
   */
  bomChildren(versionId: number, parentCode: string, plantCode: string) {
    return this.db
      .select({
        code: b.childCode, qtyPer: b.qtyPer, kind: i.kind,
        qualifiedSources: i.qualifiedSources, weeksOfCover: i.weeksOfCover,
      })
      .from(b)
      .leftJoin(i, and(eq(i.versionId, b.versionId), eq(i.holderCode, plantCode),
        eq(i.code, b.childCode)))
      .where(and(eq(b.versionId, versionId), eq(b.parentCode, parentCode)))
      .orderBy(nullsLast(b.row), asc(b.row), asc(b.id))
      .all();
  }
}

function inPlants(column: SQLWrapper, plants: readonly string[]): SQL {
  return plants.length === 0 ? sql`0` : sql`${column} in ${valueList(plants)}`;
}
