import { describe, expect, it } from 'vitest';
import type { SupplyModel } from '@keelson/contracts';
import { networkChanges } from './network-changes';

/** A two-supplier model written for this test. */
function model(): SupplyModel {
  return {
    plants: [{ code: 'P1', name: 'Plant', country: 'DE', row: 2 }],
    products: [{ code: 'F1', plantCode: 'P1', name: 'Pump', weeklyRevenue: 100, row: 2 }],
    bom: [{ parentCode: 'F1', childCode: 'C1', qtyPer: 1, row: 2 }],
    suppliers: [
      { code: 'S1', name: 'One', country: 'DE', region: 'North', recoveryWeeks: 8,
        financialHealth: null, deliveryScore: 3, hasContinuityPlan: null, row: 2 },
      { code: 'S2', name: 'Two', country: 'PL', region: 'South', recoveryWeeks: 4,
        financialHealth: 2, deliveryScore: null, hasContinuityPlan: true, row: 3 },
    ],
    sourcing: [
      { buyerCode: 'P1', itemCode: 'C1', supplierCode: 'S1', sharePct: 70, isQualified: true,
        row: 2 },
      { buyerCode: 'P1', itemCode: 'C1', supplierCode: 'S2', sharePct: 30, isQualified: true,
        row: 3 },
    ],
    stock: [],
  };
}

describe('networkChanges', () => {
  it('counts everything as added for the first version', () => {
    expect(networkChanges(null, model(), null)).toEqual({
      previousVersionId: null, suppliersAdded: ['S1', 'S2'], suppliersRemoved: [],
      suppliersChanged: [], sourcingAdded: 2, sourcingRemoved: 0, sourcingChanged: 0,
      productsAdded: ['F1'], productsRemoved: [], productsChanged: [],
    });
  });

  it('ignores moved rows and absent-versus-empty extra columns', () => {
    const next = model();
    next.suppliers.reverse();
    next.suppliers.forEach((supplier, index) => {
      supplier.row = index + 2;
    });
    next.sourcing[0]!.attributes = {};
    const changes = networkChanges(model(), next, 4);
    expect(changes).toMatchObject({ previousVersionId: 4, suppliersChanged: [],
      sourcingChanged: 0, productsChanged: [] });
  });

  it('sees changed fields, changed extra columns, and keys added and removed', () => {
    const next = model();
    next.suppliers[0]!.financialHealth = 3;
    next.suppliers[1]!.attributes = { Buyer: 'Ana' };
    next.sourcing[1]!.isQualified = false;
    next.sourcing.push({ buyerCode: 'S1', itemCode: 'R1', supplierCode: 'S2', sharePct: null,
      isQualified: true });
    next.sourcing.shift();
    next.products[0]!.name = 'Pump Mk2';
    expect(networkChanges(model(), next, 1)).toEqual({
      previousVersionId: 1, suppliersAdded: [], suppliersRemoved: [],
      suppliersChanged: ['S1', 'S2'], sourcingAdded: 1, sourcingRemoved: 1, sourcingChanged: 1,
      productsAdded: [], productsRemoved: [], productsChanged: ['F1'],
    });
  });
});
