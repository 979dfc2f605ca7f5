import { afterEach, describe, expect, it } from 'vitest';
import { IN_MEMORY, importBatches, networkItems, networkSupplierPlants, networkSuppliers,
  openDatabase, type OpenDatabase } from '@keelson/db';
import { and, eq } from 'drizzle-orm';
import { WORKED_EXAMPLE, generateTieredNetwork } from '@keelson/supply-graph/testing';
import { insertNetworkVersion, latestNetworkVersionId, readNetworkModel } from './network-store';

let opened: OpenDatabase | undefined;
afterEach(() => opened?.close());

function batch(db: OpenDatabase['db']): number {
  return db.insert(importBatches).values({
    status: 'ready', fileName: 'network.xlsx', fileSize: 1, sha256: 'x', format: 'xlsx',
    sheets: [], counts: {}, errors: [], warnings: [], errorCount: 0, warningCount: 0,
    createdAt: '2026-12-02T00:00:00.000Z',
  }).returning({ id: importBatches.id }).get().id;
}

const meta = (importBatchId: number) => ({
  importBatchId, label: 'Test', createdBy: null, createdAt: '2026-12-02T00:00:00.000Z',
  previousVersionId: null, changes: {},
});

describe('network store', () => {
  it('reads back the model it wrote, with rows and extra columns', () => {
    opened = openDatabase(IN_MEMORY);
    const { db } = opened;
    const model = generateTieredNetwork({ seed: 7, suppliers: 60, cycles: 2 });
    model.suppliers[0]!.attributes = { 'Buyer note': 'Zürich 工場' };
    const { id, counts } = db.transaction((tx) => insertNetworkVersion(tx, model, meta(batch(db))));
    expect(counts.suppliers).toBe(60);
    expect(latestNetworkVersionId(db)).toBe(id);
    expect(readNetworkModel(db, id)).toEqual(model);
    expect(readNetworkModel(db, id + 1)).toBeNull();
  });

  it('derives tiers, items and the plants each supplier serves (worked example of docs/methods.md)', () => {
    opened = openDatabase(IN_MEMORY);
    const { db } = opened;
    const { id } = db.transaction((tx) =>
      insertNetworkVersion(tx, WORKED_EXAMPLE, meta(batch(db))));
    const tierRows = db.select({ code: networkSuppliers.code, tier: networkSuppliers.tier })
      .from(networkSuppliers).where(eq(networkSuppliers.versionId, id)).all();
    // Every supplier with a tier serves at least one plant, and tier-1 suppliers sell to one.
    const served = db.select().from(networkSupplierPlants)
      .where(eq(networkSupplierPlants.versionId, id)).all();
    for (const { code, tier } of tierRows) {
      expect(served.some((row) => row.supplierCode === code)).toBe(tier !== null);
    }
    const tierOne = tierRows.filter((row) => row.tier === 1).map((row) => row.code);
    const plantBuyers = new Set(WORKED_EXAMPLE.plants.map((p) => p.code));
    for (const code of tierOne) {
      expect(WORKED_EXAMPLE.sourcing.some((r) => r.supplierCode === code
        && r.isQualified && plantBuyers.has(r.buyerCode))).toBe(true);
    }
    const bought = db.select().from(networkItems)
      .where(and(eq(networkItems.versionId, id), eq(networkItems.kind, 'bought'))).all();
    const pairs = new Set(WORKED_EXAMPLE.sourcing.map((r) => `${r.itemCode}@${r.buyerCode}`));
    // A bought item with a qualified source has a Sourcing row; one without is unsourced.
    for (const item of bought) {
      if (item.qualifiedSources > 0) expect(pairs.has(`${item.code}@${item.holderCode}`)).toBe(true);
    }
    expect(bought.filter((item) => item.qualifiedSources > 1).length).toBeGreaterThan(0);
  });
});
