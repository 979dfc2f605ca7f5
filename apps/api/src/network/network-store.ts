/**
 * Writes a validated supply model as a new network version, and reads one back. Shared by the
 * import commit, the network browser, the export and (later) the analysis runs, so every run
 * points at the exact rows it used. Derived rows (items, supplier tiers, the plants each
 * supplier serves) are computed here once, at commit, from the supply graph of spec section 2.
 */
import { asc, desc, eq } from 'drizzle-orm';
import type { SupplyModel } from '@keelson/contracts';
import {
  networkBomLines,
  networkItems,
  networkPlants,
  networkProducts,
  networkSourcing,
  networkStock,
  networkSupplierPlants,
  networkSuppliers,
  networkVersions,
  type KeelsonDatabase,
} from '@keelson/db';
import { buildSupplyGraph, tiers } from '@keelson/supply-graph';

/** Rows per multi-row INSERT: well under SQLite's 32 766 bound variables at 12 columns. */
const INSERT_CHUNK = 1000;

/** What a new version records about where it came from. */
export interface NewNetworkVersion {
  importBatchId: number;
  label: string;
  createdBy: number | null;
  createdAt: string;
  previousVersionId: number | null;
  /** `NetworkChangesDto` against the previous version. */
  changes: Record<string, unknown>;
}

/** Row counts of a version, as `NetworkVersionDto['counts']`. */
export interface NetworkCounts {
  plants: number;
  products: number;
  items: number;
  bomLines: number;
  suppliers: number;
  sourcing: number;
  stock: number;
}

/**
 * Inserts the model as a new version and returns its id and counts. Call it inside the
 * caller's transaction (`db.transaction((tx) => insertNetworkVersion(tx, ...))`): it writes
 * many tables and must land all or nothing.
 */
export function insertNetworkVersion(
  db: KeelsonDatabase,
  model: SupplyModel,
  meta: NewNetworkVersion,
): { id: number; counts: NetworkCounts } {
  const graph = buildSupplyGraph(model);
  const items = derivedItems(model, graph);
  const served = plantsServed(graph);
  const tierOf = tiers(graph);
  const counts: NetworkCounts = {
    plants: model.plants.length,
    products: model.products.length,
    items: items.length,
    bomLines: model.bom.length,
    suppliers: model.suppliers.length,
    sourcing: model.sourcing.length,
    stock: model.stock.length,
  };
  const version = db
    .insert(networkVersions)
    .values({ ...meta, counts: { ...counts } })
    .returning({ id: networkVersions.id })
    .get();
  const versionId = version.id;
  const attributes = (record: { attributes?: Record<string, string> }) =>
    record.attributes && Object.keys(record.attributes).length > 0 ? record.attributes : null;

  insertChunked(db, networkPlants, model.plants.map((p) => ({
    versionId, code: p.code, name: p.name, country: p.country, row: p.row ?? null,
    attributes: attributes(p),
  })));
  insertChunked(db, networkProducts, model.products.map((p) => ({
    versionId, code: p.code, plantCode: p.plantCode, name: p.name,
    weeklyRevenue: p.weeklyRevenue, row: p.row ?? null, attributes: attributes(p),
  })));
  insertChunked(db, networkBomLines, model.bom.map((b) => ({
    versionId, parentCode: b.parentCode, childCode: b.childCode, qtyPer: b.qtyPer,
    row: b.row ?? null, attributes: attributes(b),
  })));
  insertChunked(db, networkSuppliers, model.suppliers.map((s) => ({
    versionId, code: s.code, name: s.name, country: s.country, region: s.region,
    recoveryWeeks: s.recoveryWeeks, financialHealth: s.financialHealth,
    deliveryScore: s.deliveryScore, hasContinuityPlan: s.hasContinuityPlan,
    tier: tierOf.get(s.code) ?? null, row: s.row ?? null, attributes: attributes(s),
  })));
  insertChunked(db, networkSourcing, model.sourcing.map((r) => ({
    versionId, buyerCode: r.buyerCode, itemCode: r.itemCode, supplierCode: r.supplierCode,
    sharePct: r.sharePct, isQualified: r.isQualified, row: r.row ?? null,
    attributes: attributes(r),
  })));
  insertChunked(db, networkStock, model.stock.map((s) => ({
    versionId, plantCode: s.plantCode, itemCode: s.itemCode, weeksOfCover: s.weeksOfCover,
    row: s.row ?? null, attributes: attributes(s),
  })));
  insertChunked(db, networkItems, items.map((item) => ({ versionId, ...item })));
  insertChunked(db, networkSupplierPlants, served.map(([supplierCode, plantCode]) => ({
    versionId, supplierCode, plantCode,
  })));
  return { id: versionId, counts };
}

// Drizzle's table generics do not survive a shared helper; the rows are built per table above.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
function insertChunked(db: KeelsonDatabase, table: any, rows: readonly object[]): void {
  for (let start = 0; start < rows.length; start += INSERT_CHUNK) {
    db.insert(table).values(rows.slice(start, start + INSERT_CHUNK)).run();
  }
}

type DerivedItem = Omit<typeof networkItems.$inferInsert, 'versionId'>;

/** One row per item node of the graph: (item, holder), made or bought, sources, cover. */
function derivedItems(model: SupplyModel, graph: ReturnType<typeof buildSupplyGraph>) {
  const cover = new Map(model.stock.map((s) => [`${s.itemCode}\u0000${s.plantCode}`, s.weeksOfCover]));
  const qualified = new Map<string, number>();
  for (const row of model.sourcing) {
    if (!row.isQualified) continue;
    const key = `${row.itemCode}\u0000${row.buyerCode}`;
    qualified.set(key, (qualified.get(key) ?? 0) + 1);
  }
  const items: DerivedItem[] = [];
  for (const node of graph.nodes) {
    if (node.kind !== 'item' || node.buyer === null || node.buyerKind === null) continue;
    const key = `${node.code}\u0000${node.buyer}`;
    items.push({
      code: node.code,
      holderCode: node.buyer,
      holderKind: node.buyerKind,
      kind: node.isMade ? 'made' : 'bought',
      qualifiedSources: node.isMade ? 0 : (qualified.get(key) ?? 0),
      usedIn: graph.offsets[node.index + 1]! - graph.offsets[node.index]!,
      weeksOfCover: node.isMade || node.buyerKind !== 'plant' ? null : (cover.get(key) ?? null),
    });
  }
  return items;
}

/** [supplier, plant] for every plant a supplier's material reaches, by walking edges backwards. */
function plantsServed(graph: ReturnType<typeof buildSupplyGraph>): [string, string][] {
  const { n, inOffsets, inSources, kind, nodes, plantNodes, plantCodes } = graph;
  const pairs: [string, string][] = [];
  const seen = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  plantNodes.forEach((plantNode, p) => {
    let tail = 0;
    queue[tail++] = plantNode;
    seen[plantNode] = p;
    for (let head = 0; head < tail; head++) {
      const v = queue[head]!;
      for (let e = inOffsets[v]!; e < inOffsets[v + 1]!; e++) {
        const u = inSources[e]!;
        if (seen[u] === p) continue;
        seen[u] = p;
        queue[tail++] = u;
        if (kind[u] === 3) pairs.push([nodes[u]!.code, plantCodes[p]!]);
      }
    }
  });
  return pairs;
}

/** The id of the most recent version, or null when nothing has been imported. */
export function latestNetworkVersionId(db: KeelsonDatabase): number | null {
  const row = db
    .select({ id: networkVersions.id })
    .from(networkVersions)
    .orderBy(desc(networkVersions.id))
    .limit(1)
    .get();
  return row?.id ?? null;
}

/** The supply model of a version, rows in spreadsheet order; null when there is no such version. */
export function readNetworkModel(db: KeelsonDatabase, versionId: number): SupplyModel | null {
  const version = db
    .select({ id: networkVersions.id })
    .from(networkVersions)
    .where(eq(networkVersions.id, versionId))
    .get();
  if (!version) return null;
  const withExtras = <T extends { row: number | null; attributes: Record<string, string> | null }>(
    record: T,
  ) => {
    const { row, attributes, ...rest } = record;
    return {
      ...rest,
      ...(row === null ? {} : { row }),
      ...(attributes === null ? {} : { attributes }),
    };
  };
  const plants = db
    .select({ code: networkPlants.code, name: networkPlants.name, country: networkPlants.country,
      row: networkPlants.row, attributes: networkPlants.attributes })
    .from(networkPlants).where(eq(networkPlants.versionId, versionId))
    .orderBy(asc(networkPlants.row), asc(networkPlants.code)).all().map(withExtras);
  const products = db
    .select({ code: networkProducts.code, plantCode: networkProducts.plantCode,
      name: networkProducts.name, weeklyRevenue: networkProducts.weeklyRevenue,
      row: networkProducts.row, attributes: networkProducts.attributes })
    .from(networkProducts).where(eq(networkProducts.versionId, versionId))
    .orderBy(asc(networkProducts.row), asc(networkProducts.code)).all().map(withExtras);
  const bom = db
    .select({ parentCode: networkBomLines.parentCode, childCode: networkBomLines.childCode,
      qtyPer: networkBomLines.qtyPer, row: networkBomLines.row,
      attributes: networkBomLines.attributes })
    .from(networkBomLines).where(eq(networkBomLines.versionId, versionId))
    .orderBy(asc(networkBomLines.id)).all().map(withExtras);
  const suppliers = db
    .select({ code: networkSuppliers.code, name: networkSuppliers.name,
      country: networkSuppliers.country, region: networkSuppliers.region,
      recoveryWeeks: networkSuppliers.recoveryWeeks,
      financialHealth: networkSuppliers.financialHealth,
      deliveryScore: networkSuppliers.deliveryScore,
      hasContinuityPlan: networkSuppliers.hasContinuityPlan,
      row: networkSuppliers.row, attributes: networkSuppliers.attributes })
    .from(networkSuppliers).where(eq(networkSuppliers.versionId, versionId))
    .orderBy(asc(networkSuppliers.row), asc(networkSuppliers.code)).all().map(withExtras);
  const sourcing = db
    .select({ buyerCode: networkSourcing.buyerCode, itemCode: networkSourcing.itemCode,
      supplierCode: networkSourcing.supplierCode, sharePct: networkSourcing.sharePct,
      isQualified: networkSourcing.isQualified, row: networkSourcing.row,
      attributes: networkSourcing.attributes })
    .from(networkSourcing).where(eq(networkSourcing.versionId, versionId))
    .orderBy(asc(networkSourcing.id)).all().map(withExtras);
  const stock = db
    .select({ plantCode: networkStock.plantCode, itemCode: networkStock.itemCode,
      weeksOfCover: networkStock.weeksOfCover, row: networkStock.row,
      attributes: networkStock.attributes })
    .from(networkStock).where(eq(networkStock.versionId, versionId))
    .orderBy(asc(networkStock.id)).all().map(withExtras);
  return { plants, products, bom, suppliers, sourcing, stock };
}
