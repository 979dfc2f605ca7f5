/**
 * The "qualified alternatives" input of the likelihood: for each supplier, over every
 * (item, buyer) it is a qualified source of, how many other qualified sources that pair has; the
 * fewest of them. A supplier that is the only qualified source of anything gets 0.
 */
import type { SupplyModel } from '@keelson/contracts';

/** Fewest qualified alternatives per supplier code; null for suppliers that sell nothing qualified. */
export function fewestAlternativesBySupplier(model: SupplyModel): Map<string, number | null> {
  const sources = new Map<string, Set<string>>();
  for (const row of model.sourcing) {
    if (!row.isQualified) continue;
    const key = `${row.itemCode}\u0000${row.buyerCode}`;
    const set = sources.get(key) ?? new Set<string>();
    set.add(row.supplierCode);
    sources.set(key, set);
  }
  const fewest = new Map<string, number | null>(model.suppliers.map((s) => [s.code, null]));
  for (const set of sources.values()) {
    for (const supplier of set) {
      const alternatives = set.size - 1;
      const current = fewest.get(supplier);
      if (current === undefined) continue;
      fewest.set(supplier, current === null ? alternatives : Math.min(current, alternatives));
    }
  }
  return fewest;
}
