/**
 * Writes a validated supply model as a new network version, and reads one back. Shared by the
 * import commit, the network browser, the export and (later) the analysis runs, so every run
 * points at the exact rows it used. Derived rows (items, supplier tiers, the plants each
 * supplier serves) are computed here once, at commit, from the supply graph of spec section 2.
 */
import { asc, desc, eq } from 'drizzle-orm';
import type { SupplyModel } from '@keelson/contracts';
import {
  connectionOf,
  insertRows,
  networkBomLines,
  networkItems,
  networkPlants,
  networkProducts,
  networkSourcing,
  networkStock,
  networkSuppliers,
  networkVersions,
  type KeelsonDatabase,
} from '@keelson/db';
import { buildSupplyGraph, tiers } from '@keelson/supply-graph';

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
  const connection = connectionOf(db);
  const json = (record: { attributes?: Record<string, string> }) =>
    record.attributes && Object.keys(record.attributes).length > 0
      ? JSON.stringify(record.attributes)
      : null;
  const flag = (value: boolean | null) => (value === null ? null : value ? 1 : 0);
  const row = (record: { row?: number }) => record.row ?? null;

  insertRows(connection, 'network_plants',
    ['version_id', 'code', 'name', 'country', 'row', 'attributes'],
    model.plants, (p) => [versionId, p.code, p.name, p.country, row(p), json(p)]);
  insertRows(connection, 'network_products',
    ['version_id', 'code', 'plant_code', 'name', 'weekly_revenue', 'row', 'attributes'],
    model.products,
    (p) => [versionId, p.code, p.plantCode, p.name, p.weeklyRevenue, row(p), json(p)]);
  insertRows(connection, 'network_bom_lines',
    ['version_id', 'parent_code', 'child_code', 'qty_per', 'row', 'attributes'],
    model.bom, (b) => [versionId, b.parentCode, b.childCode, b.qtyPer, row(b), json(b)]);
  insertRows(connection, 'network_suppliers',
    ['version_id', 'code', 'name', 'country', 'region', 'recovery_weeks', 'financial_health',
      'delivery_score', 'has_continuity_plan', 'tier', 'row', 'attributes'],
    model.suppliers, (s) => [versionId, s.code, s.name, s.country, s.region, s.recoveryWeeks,
      s.financialHealth, s.deliveryScore, flag(s.hasContinuityPlan), tierOf.get(s.code) ?? null,
      row(s), json(s)]);
  insertRows(connection, 'network_sourcing',
    ['version_id', 'buyer_code', 'item_code', 'supplier_code', 'share_pct', 'is_qualified', 'row',
      'attributes'],
    model.sourcing, (r) => [versionId, r.buyerCode, r.itemCode, r.supplierCode, r.sharePct,
      flag(r.isQualified), row(r), json(r)]);
  insertRows(connection, 'network_stock',
    ['version_id', 'plant_code', 'item_code', 'weeks_of_cover', 'row', 'attributes'],
    model.stock, (s) => [versionId, s.plantCode, s.itemCode, s.weeksOfCover, row(s), json(s)]);
  insertRows(connection, 'network_items',
    ['version_id', 'code', 'holder_code', 'holder_kind', 'kind', 'qualified_sources', 'used_in',
      'weeks_of_cover'],
    items, (i) => [versionId, i.code, i.holderCode, i.holderKind, i.kind, i.qualifiedSources,
      i.usedIn, i.weeksOfCover ?? null]);
  insertRows(connection, 'network_supplier_plants',
    ['version_id', 'supplier_code', 'plant_code'],
    served, ([supplierCode, plantCode]) => [versionId, supplierCode, plantCode]);
  return { id: versionId, counts };
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
