/**
 * Small supply models written compactly in tests: tuples instead of full records, defaults for
 * everything optional (recovery 8 weeks, qualified rows, cover 0).
 */
import type { SupplyModel } from '@keelson/contracts';

/** A compact description of a supply model. */
export interface CompactModel {
  /** Plant codes. */
  plants: string[];
  /** [product, plant, weekly revenue]. */
  products: Array<[string, string, number]>;
  /** [parent, child]. */
  bom: Array<[string, string]>;
  /** Supplier codes, or [code, recovery weeks, country?]. */
  suppliers: Array<string | [string, number, string?]>;
  /** [buyer, item, supplier, qualified?]. */
  sourcing: Array<[string, string, string, boolean?]>;
  /** [plant, item, weeks of cover]. */
  stock?: Array<[string, string, number]>;
}

/** Expands a {@link CompactModel} into a full supply model. */
export function compactModel(compact: CompactModel): SupplyModel {
  return {
    plants: compact.plants.map((code, i) => ({ code, name: code, country: 'DE', row: i + 2 })),
    products: compact.products.map(([code, plantCode, weeklyRevenue], i) => ({
      code,
      plantCode,
      name: code,
      weeklyRevenue,
      row: i + 2,
    })),
    bom: compact.bom.map(([parentCode, childCode], i) => ({
      parentCode,
      childCode,
      qtyPer: 1,
      row: i + 2,
    })),
    suppliers: compact.suppliers.map((entry, i) => {
      const [code, recoveryWeeks, country] = typeof entry === 'string' ? [entry, 8, 'DE'] : entry;
      return {
        code,
        name: code,
        country: country ?? 'DE',
        region: '',
        recoveryWeeks,
        financialHealth: null,
        deliveryScore: null,
        hasContinuityPlan: null,
        row: i + 2,
      };
    }),
    sourcing: compact.sourcing.map(([buyerCode, itemCode, supplierCode, qualified], i) => ({
      buyerCode,
      itemCode,
      supplierCode,
      sharePct: null,
      isQualified: qualified ?? true,
      row: i + 2,
    })),
    stock: (compact.stock ?? []).map(([plantCode, itemCode, weeksOfCover], i) => ({
      plantCode,
      itemCode,
      weeksOfCover,
      row: i + 2,
    })),
  };
}
