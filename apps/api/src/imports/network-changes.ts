/**
 * What a commit changes against the previous network version: suppliers and products by code,
 * sourcing rows by (buyer, item, supplier). A record counts as changed when any of its own
 * fields (or its extra columns) differ; the spreadsheet row it sits on does not count.
 */
import type { NetworkChangesDto, SupplyModel } from '@keelson/contracts';

type Keyed = { row?: number; attributes?: Record<string, string> };

/** Compares two models; `previous` null means the first version (everything is added). */
export function networkChanges(
  previous: SupplyModel | null,
  next: SupplyModel,
  previousVersionId: number | null,
): NetworkChangesDto {
  const before = previous ?? { plants: [], products: [], bom: [], suppliers: [], sourcing: [],
    stock: [] };
  const suppliers = compareBy(before.suppliers, next.suppliers, (s) => s.code);
  const products = compareBy(before.products, next.products, (p) => p.code);
  const sourcing = compareBy(before.sourcing, next.sourcing,
    (r) => `${r.buyerCode}\u0000${r.itemCode}\u0000${r.supplierCode}`);
  return {
    previousVersionId,
    suppliersAdded: suppliers.added,
    suppliersRemoved: suppliers.removed,
    suppliersChanged: suppliers.changed,
    sourcingAdded: sourcing.added.length,
    sourcingRemoved: sourcing.removed.length,
    sourcingChanged: sourcing.changed.length,
    productsAdded: products.added,
    productsRemoved: products.removed,
    productsChanged: products.changed,
  };
}

interface Comparison {
  added: string[];
  removed: string[];
  changed: string[];
}

/**
 * Keys added, removed and changed, each in code order. A key repeated within one model (the
 * reader refuses that for suppliers and products) is compared by its last record.
 */
function compareBy<T extends Keyed>(
  before: readonly T[],
  after: readonly T[],
  keyOf: (record: T) => string,
): Comparison {
  const old = new Map(before.map((record) => [keyOf(record), record]));
  const now = new Map(after.map((record) => [keyOf(record), record]));
  const comparison: Comparison = { added: [], removed: [], changed: [] };
  for (const [key, record] of now) {
    const was = old.get(key);
    if (was === undefined) {
      comparison.added.push(key);
    } else if (!sameFields(was, record)) {
      comparison.changed.push(key);
    }
  }
  for (const key of old.keys()) {
    if (!now.has(key)) {
      comparison.removed.push(key);
    }
  }
  const byCode = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  comparison.added.sort(byCode);
  comparison.removed.sort(byCode);
  comparison.changed.sort(byCode);
  return comparison;
}

/** True when both records hold the same fields, ignoring the row and absent attributes. */
function sameFields(a: Keyed, b: Keyed): boolean {
  const fieldsOf = (record: Keyed) => {
    const { row: _row, attributes, ...fields } = record;
    void _row;
    const extras = attributes ?? {};
    return { fields, extras };
  };
  const left = fieldsOf(a);
  const right = fieldsOf(b);
  return sameRecord(left.fields, right.fields) && sameRecord(left.extras, right.extras);
}

function sameRecord(a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  for (const key of keys) {
    if (a[key] !== b[key]) {
      return false;
    }
  }
  return true;
}
