/**
 * Warnings (spec 8.16): problems that do not block an import. A product with no BOM depends on
 * no supplier; a supplier no qualified row buys from cannot fail anyone; an item bought with no
 * qualified source is down from the start. The unsourced warning sits on the first Sourcing
 * row of that (buyer, item), or, when a plant needs a leaf item it has no Sourcing row for, on
 * the first BOM row that brings the item to the plant.
 */
import type { SheetName, SupplyModel, WorkbookWarning } from '@keelson/contracts';
import type { ModelCodes } from './model-checks';
import type { ProblemLocator } from './problem-locator';

/** The warnings of a model. */
export function collectWarnings(
  model: SupplyModel,
  codes: ModelCodes,
  locator: ProblemLocator,
): WorkbookWarning[] {
  const warnings: WorkbookWarning[] = [];
  const warn = (sheet: SheetName, row: number | undefined, kind: WorkbookWarning['kind'],
    message: string) => {
    warnings.push({ sheet: locator.sheet(sheet), row: row ?? null, kind, message });
  };
  const parents = new Set(model.bom.map((line) => line.parentCode));
  for (const product of model.products) {
    if (!parents.has(product.code)) {
      warn('Products', product.row, 'product-no-bom',
        `product "${product.code}" has no BOM rows, so no supplier failure can affect it`);
    }
  }
  const sellers = new Set(model.sourcing.filter((row) => row.isQualified)
    .map((row) => row.supplierCode));
  for (const supplier of model.suppliers) {
    if (!sellers.has(supplier.code)) {
      warn('Suppliers', supplier.row, 'supplier-unused',
        `supplier "${supplier.code}" is not the supplier of any qualified Sourcing row`);
    }
  }
  // (buyer, item) pairs of Sourcing in row order, with whether any of their rows is qualified.
  const pairs = new Map<string, { row: number | undefined; isSourced: boolean }>();
  for (const row of model.sourcing) {
    const key = JSON.stringify([row.buyerCode, row.itemCode]);
    const pair = pairs.get(key);
    if (pair === undefined) {
      pairs.set(key, { row: row.row, isSourced: row.isQualified });
    } else {
      pair.isSourced ||= row.isQualified;
    }
  }
  for (const [key, pair] of pairs) {
    const [buyer, item] = JSON.parse(key) as [string, string];
    const isBuyer = codes.plants.has(buyer) || codes.suppliers.has(buyer);
    if (!pair.isSourced && isBuyer) {
      warn('Sourcing', pair.row, 'unsourced',
        `item "${item}" bought by "${buyer}" has no qualified source, so it counts as lost ` +
        'even before any failure');
    }
  }
  for (const { plant, item, row } of unsourcedLeaves(model, codes, pairs)) {
    warn('BOM', row, 'unsourced',
      `plant "${plant}" needs item "${item}" (through its BOM) but has no Sourcing row for it, ` +
      'so it counts as lost even before any failure');
  }
  return warnings;
}

interface UnsourcedLeaf {
  plant: string;
  item: string;
  row: number | undefined;
}

/** Leaf items reached through a plant's products that the plant has no Sourcing row for. */
function unsourcedLeaves(
  model: SupplyModel,
  codes: ModelCodes,
  pairs: ReadonlyMap<string, unknown>,
): UnsourcedLeaf[] {
  const lines = new Map<string, typeof model.bom>();
  for (const line of model.bom) {
    const list = lines.get(line.parentCode) ?? [];
    list.push(line);
    lines.set(line.parentCode, list);
  }
  const isDefined = (code: string) =>
    codes.plants.has(code) || codes.products.has(code) || codes.suppliers.has(code);
  const found: UnsourcedLeaf[] = [];
  for (const plant of codes.plants.keys()) {
    // Each reached item with the BOM row that first brings it to the plant (lowest row).
    const firstLine = new Map<string, number | undefined>();
    const queue = model.products.filter((product) => product.plantCode === plant)
      .map((product) => product.code);
    const visited = new Set(queue);
    for (let head = 0; head < queue.length; head += 1) {
      for (const line of lines.get(queue[head] as string) ?? []) {
        const child = line.childCode;
        if (isDefined(child)) {
          continue;
        }
        const known = firstLine.get(child);
        if (!firstLine.has(child) || isEarlier(line.row, known)) {
          firstLine.set(child, line.row);
        }
        if (!visited.has(child)) {
          visited.add(child);
          queue.push(child);
        }
      }
    }
    for (const [item, row] of firstLine) {
      if (!lines.has(item) && !pairs.has(JSON.stringify([plant, item]))) {
        found.push({ plant, item, row });
      }
    }
  }
  return found;
}

function isEarlier(row: number | undefined, than: number | undefined): boolean {
  return row !== undefined && (than === undefined || row < than);
}
