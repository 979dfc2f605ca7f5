/**
 * The demo network one quarter later: Tarnwell Hydraulics next quarter, built from the same
 * seeded model as `data/demo/keelson-demo.xlsx` with exactly three changes, so the comparison of
 * the two quarterly runs has a known answer (asserted in tools/generate-demo.spec.ts and in
 * apps/api/src/comparison/comparison.router.spec.ts):
 *
 * 1. A supplier removed: `S-2-003` (Álvarez-Roca Motors, tier 2) leaves the network with every
 *    sourcing row it sells or buys. Every buyer of it has another qualified source, so no other
 *    supplier becomes a single point of failure, and it was not one itself.
 * 2. A new dual source: `S-2-004` (Silvane Tooling, already in the network) is qualified for
 *    material `M-02` at `S-1-003` and `S-1-004` next to `S-2-SHARED-B` (60 / 40), so
 *    `S-2-SHARED-B` stops being a single point of failure.
 * 3. A new single point of failure: `S-1-096` (Eskar Seal Systems, new) wins a sole-source
 *    contract for item `C-056` at plant `P-NORTH`; the two previous sources of that item there
 *    (`S-1-009`, `S-1-062`) no longer supply it (they keep their other items).
 *
 * So the comparison of Q2 against Q1 shows: new single point `S-1-096`, gone `S-2-SHARED-B`,
 * supplier added `S-1-096`, supplier removed `S-2-003`. Nothing that the browser journeys use
 * changes (S-2-SHARED-A, S-2-011, material M-01 and its suppliers).
 */
import type { SourcingRow, Supplier, SupplyModel } from '@keelson/contracts';
import { buildDemoNetwork } from './demo-network';

/** The codes the next quarter changes, and what the comparison of the two runs shows. */
export const Q2_CHANGES = {
  removedSupplier: 'S-2-003',
  dualSource: { itemCode: 'M-02', supplierCode: 'S-2-004', buyers: ['S-1-003', 'S-1-004'],
    formerSinglePoint: 'S-2-SHARED-B' },
  newSinglePoint: { supplierCode: 'S-1-096', itemCode: 'C-056', plantCode: 'P-NORTH',
    formerSources: ['S-1-009', 'S-1-062'] },
  /** What GET /api/comparison answers for Q2 against Q1, by supplier code. */
  expected: {
    newSinglePoints: ['S-1-096'],
    goneSinglePoints: ['S-2-SHARED-B'],
    suppliersAdded: ['S-1-096'],
    suppliersRemoved: ['S-2-003'],
  },
} as const;

/** The new supplier of change 3 (invented, like every name of the demo). */
const NEW_SUPPLIER: Supplier = {
  code: Q2_CHANGES.newSinglePoint.supplierCode,
  name: 'Eskar Seal Systems',
  country: 'SE',
  region: 'Europe',
  recoveryWeeks: 12,
  financialHealth: 3,
  deliveryScore: 3,
  hasContinuityPlan: false,
};

/** The next quarter's model: {@link buildDemoNetwork} with the three {@link Q2_CHANGES}. */
export function buildDemoNetworkQ2(base: SupplyModel = buildDemoNetwork()): SupplyModel {
  const removed = Q2_CHANGES.removedSupplier;
  const dual = Q2_CHANGES.dualSource;
  const single = Q2_CHANGES.newSinglePoint;
  const sourcing: SourcingRow[] = base.sourcing
    .filter((row) => row.supplierCode !== removed && row.buyerCode !== removed)
    .filter((row) => !(row.buyerCode === single.plantCode && row.itemCode === single.itemCode))
    .map((row) => row.itemCode === dual.itemCode && row.supplierCode === dual.formerSinglePoint
      && (dual.buyers as readonly string[]).includes(row.buyerCode)
      ? { ...row, sharePct: 60 } : { ...row });
  for (const buyerCode of dual.buyers) {
    sourcing.push({ buyerCode, itemCode: dual.itemCode, supplierCode: dual.supplierCode,
      sharePct: 40, isQualified: true });
  }
  sourcing.push({ buyerCode: single.plantCode, itemCode: single.itemCode,
    supplierCode: single.supplierCode, sharePct: 100, isQualified: true });
  return {
    ...base,
    suppliers: [...base.suppliers.filter((supplier) => supplier.code !== removed),
      { ...NEW_SUPPLIER }],
    sourcing,
  };
}
