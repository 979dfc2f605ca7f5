/**
 * Test data of the network specs: a small hand-made network whose derived facts (tiers, plants
 * served, items) are worked out by hand below, a generated one on the demo workspace's plants,
 * and a helper that stores a model as a version the way a commit does (batch row, then the
 * version in one transaction).
 */
import type { SupplyModel } from '@keelson/contracts';
import { importBatches, type KeelsonDatabase } from '@keelson/db';
import { generateTieredNetwork } from '@keelson/supply-graph/testing';
import { insertNetworkVersion } from './network-store';

/** Where a test version came from. */
export interface TestVersionOptions {
  fileName?: string;
  createdBy?: number | null;
  createdAt?: string;
  label?: string;
}

/** Inserts an import batch and the model as a version of it; returns the version id. */
export function insertTestVersion(
  db: KeelsonDatabase,
  model: SupplyModel,
  options: TestVersionOptions = {},
): number {
  const createdAt = options.createdAt ?? '2026-03-02T08:00:00.000Z';
  const createdBy = options.createdBy ?? null;
  return db.transaction((tx) => {
    const batchId = tx.insert(importBatches).values({
      status: 'committed', fileName: options.fileName ?? 'network.xlsx', fileSize: 1024,
      sha256: 'ab'.repeat(32), format: 'xlsx', sheets: [], counts: {}, errors: [], warnings: [],
      errorCount: 0, warningCount: 0, createdBy, createdAt, committedAt: createdAt,
    }).returning({ id: importBatches.id }).get().id;
    return insertNetworkVersion(tx, model, {
      importBatchId: batchId, label: options.label ?? 'Test network', createdBy, createdAt,
      previousVersionId: null, changes: {},
    }).id;
  });
}

const supplier = (code: string, name: string, country: string, region: string, tier: number) => ({
  code, name, country, region, recoveryWeeks: tier * 4, financialHealth: tier === 2 ? null : 3,
  deliveryScore: 4, hasContinuityPlan: tier === 1 ? true : null,
});

/**
 * Two demo plants, three products, six suppliers. Worked out by hand from spec section 2:
 * - S1, S2, S3 sell qualified parts to P-NORTH (tier 1); S3 and S5 sell to P-SOUTH (tier 1);
 *   S4 sells C1 to S2 and C2 to S5 (tier 2, serves both plants); S6 sells nothing (no tier);
 * - at P-NORTH, F1 = 2 x A1 + I3, A1 = 4 x I1 + I2 (A1 is made), F2 = 2 x I2; at P-SOUTH
 *   F3 = I2 + 3 x I4;
 * - I1 at P-NORTH has one qualified source (S1; the S3 row is unqualified), I2 at P-NORTH two;
 * - items: A1, I1, I2, I3 at P-NORTH; I2, I4 at P-SOUTH; C1 at S2; C2 at S5 (8 rows).
 */
export function smallNetwork(): SupplyModel {
  return {
    plants: [
      { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE', row: 2 },
      { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES', row: 3 },
    ],
    products: [
      { code: 'F1', plantCode: 'P-NORTH', name: 'Pump housing', weeklyRevenue: 50_000, row: 2 },
      { code: 'F2', plantCode: 'P-NORTH', name: 'Valve body', weeklyRevenue: 30_000, row: 3 },
      { code: 'F3', plantCode: 'P-SOUTH', name: 'Gear unit', weeklyRevenue: 20_000, row: 4 },
    ],
    bom: ([
      ['F1', 'A1', 2], ['F1', 'I3', 1], ['A1', 'I1', 4], ['A1', 'I2', 1], ['F2', 'I2', 2],
      ['F3', 'I2', 1], ['F3', 'I4', 3],
    ] as const).map(([parentCode, childCode, qtyPer], i) => ({
      parentCode, childCode, qtyPer, row: i + 2,
    })),
    suppliers: [
      { ...supplier('S1', 'Acme 50% Castings', 'DE', 'Europe', 1), row: 2,
        attributes: { 'Buyer note': 'Zürich office' } },
      { ...supplier('S2', 'Under_score Metals', 'CN', 'Asia', 1), row: 3 },
      { ...supplier('S3', 'Plain Forge', 'CN', 'Asia', 1), row: 4 },
      { ...supplier('S4', 'Deep Tier Alloys', 'TW', 'Asia', 2), row: 5 },
      { ...supplier('S5', 'Southern Plastics', 'MX', 'Americas', 1), row: 6 },
      { ...supplier('S6', 'Idle Works', 'US', 'Americas', 3), row: 7 },
    ],
    sourcing: ([
      ['P-NORTH', 'I1', 'S1', 60, true], ['P-NORTH', 'I1', 'S3', null, false],
      ['P-NORTH', 'I2', 'S2', 50, true], ['P-NORTH', 'I2', 'S3', 50, true],
      ['P-NORTH', 'I3', 'S2', null, true], ['P-SOUTH', 'I2', 'S3', null, true],
      ['P-SOUTH', 'I4', 'S5', null, true], ['S2', 'C1', 'S4', null, true],
      ['S5', 'C2', 'S4', null, true],
    ] as const).map(([buyerCode, itemCode, supplierCode, sharePct, isQualified], i) => ({
      buyerCode, itemCode, supplierCode, sharePct, isQualified, row: i + 2,
    })),
    stock: [
      { plantCode: 'P-NORTH', itemCode: 'I1', weeksOfCover: 2, row: 2 },
      { plantCode: 'P-NORTH', itemCode: 'I2', weeksOfCover: 1.5, row: 3 },
      { plantCode: 'P-SOUTH', itemCode: 'I4', weeksOfCover: 3, row: 4 },
    ],
  };
}

/**
 * A generated tiered network on the demo plants P-NORTH and P-SOUTH, with some optional
 * supplier fields blanked so that null ordering is exercised.
 */
export function generatedNetwork(seed: number, suppliers: number): SupplyModel {
  const model = generateTieredNetwork({ seed, suppliers, plants: 2, cycles: 3 });
  const rename = new Map([['PL-001', 'P-NORTH'], ['PL-002', 'P-SOUTH']]);
  const plant = (code: string) => rename.get(code) ?? code;
  model.plants.forEach((p) => (p.code = plant(p.code)));
  model.products.forEach((p) => (p.plantCode = plant(p.plantCode)));
  model.sourcing.forEach((r) => (r.buyerCode = plant(r.buyerCode)));
  model.stock.forEach((s) => (s.plantCode = plant(s.plantCode)));
  model.suppliers.forEach((s, i) => {
    if (i % 7 === 3) s.financialHealth = null;
    if (i % 5 === 1) s.deliveryScore = null;
    if (i % 6 === 2) s.hasContinuityPlan = null;
  });
  return model;
}
