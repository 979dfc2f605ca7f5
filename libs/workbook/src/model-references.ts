/**
 * One kind per code and the references between sheets (spec 8.8), and items both made and
 * bought at a plant (spec 8.9). Plants, Products and Suppliers define codes; BOM, Sourcing and
 * Stock use them. A reference into a sheet that could not be read whole (missing, or without
 * its code column) is not checked, since its error would only repeat the sheet's own error.
 */
import type { SheetName, SupplyModel, WorkbookError } from '@keelson/contracts';
import type { IncompleteSheets, ModelCodes } from './model-checks';
import type { MakeError } from './problem-locator';

type Kind = 'plant' | 'product' | 'supplier';

/** Codes used by two kinds, and items that are really plants, products or suppliers. */
export function checkKinds(
  model: SupplyModel,
  codes: ModelCodes,
  makeError: MakeError,
): WorkbookError[] {
  const errors: WorkbookError[] = [];
  const kindOf = (code: string): { kind: Kind; row: number | undefined } | null => {
    for (const kind of ['plant', 'product', 'supplier'] as const) {
      const table = kind === 'plant' ? codes.plants : kind === 'product' ? codes.products
        : codes.suppliers;
      if (table.has(code)) {
        return { kind, row: table.get(code) };
      }
    }
    return null;
  };
  const earlier = (code: string, tables: [Kind, Map<string, number | undefined>][]) =>
    tables.find(([, table]) => table.has(code));
  for (const product of model.products) {
    const clash = earlier(product.code, [['plant', codes.plants]]);
    if (clash !== undefined) {
      errors.push(makeError('Products', product.row, 'product_code', product.code,
        `product_code "${product.code}" is already a plant code` +
        `${rowNote(clash[1].get(product.code), 'Plants')}; ` +
        'a code may name only one kind'));
    }
  }
  for (const supplier of model.suppliers) {
    const clash = earlier(supplier.code, [['plant', codes.plants], ['product', codes.products]]);
    if (clash !== undefined) {
      const sheet = clash[0] === 'plant' ? 'Plants' : 'Products';
      errors.push(makeError('Suppliers', supplier.row, 'supplier_code', supplier.code,
        `supplier_code "${supplier.code}" is already a ${clash[0]} code` +
        `${rowNote(clash[1].get(supplier.code), sheet)}; a code may name only one kind`));
    }
  }
  const asItem = (sheet: SheetName, row: number | undefined, column: string, code: string,
    allowProduct: boolean) => {
    const found = kindOf(code);
    if (found === null || (allowProduct && found.kind === 'product')) {
      return;
    }
    errors.push(makeError(sheet, row, column, code,
      `${column} "${code}" is a ${found.kind} code, not an item` +
      (allowProduct ? ' (a BOM parent must be a product or an item)' : '')));
  };
  for (const line of model.bom) {
    asItem('BOM', line.row, 'parent_code', line.parentCode, true);
    asItem('BOM', line.row, 'child_code', line.childCode, false);
  }
  for (const row of model.sourcing) {
    asItem('Sourcing', row.row, 'item_code', row.itemCode, false);
  }
  for (const row of model.stock) {
    asItem('Stock', row.row, 'item_code', row.itemCode, false);
  }
  return errors;
}

/** References to plants and suppliers that the model does not define. */
export function checkReferences(
  model: SupplyModel,
  codes: ModelCodes,
  incomplete: IncompleteSheets,
  makeError: MakeError,
): WorkbookError[] {
  const errors: WorkbookError[] = [];
  const knowsPlants = !incomplete.has('Plants');
  const knowsSuppliers = !incomplete.has('Suppliers');
  for (const product of model.products) {
    if (knowsPlants && !codes.plants.has(product.plantCode)) {
      errors.push(makeError('Products', product.row, 'plant_code', product.plantCode,
        `plant_code "${product.plantCode}" is not a plant of the Plants sheet`));
    }
  }
  for (const row of model.sourcing) {
    const isKnownBuyer = codes.plants.has(row.buyerCode) || codes.suppliers.has(row.buyerCode);
    if (knowsPlants && knowsSuppliers && !isKnownBuyer) {
      errors.push(makeError('Sourcing', row.row, 'buyer_code', row.buyerCode,
        `buyer_code "${row.buyerCode}" is neither a plant nor a supplier`));
    }
    if (knowsSuppliers && !codes.suppliers.has(row.supplierCode)) {
      errors.push(makeError('Sourcing', row.row, 'supplier_code', row.supplierCode,
        `supplier_code "${row.supplierCode}" is not a supplier of the Suppliers sheet`));
    }
  }
  for (const row of model.stock) {
    if (knowsPlants && !codes.plants.has(row.plantCode)) {
      errors.push(makeError('Stock', row.row, 'plant_code', row.plantCode,
        `plant_code "${row.plantCode}" is not a plant of the Plants sheet`));
    }
  }
  return errors;
}

/** Sourcing rows in which a plant buys an item that has BOM children (spec 8.9). */
export function checkMadeAndBought(
  model: SupplyModel,
  codes: ModelCodes,
  makeError: MakeError,
): WorkbookError[] {
  const madeItems = new Map<string, number | undefined>();
  for (const line of model.bom) {
    if (!madeItems.has(line.parentCode)) {
      madeItems.set(line.parentCode, line.row);
    }
  }
  const errors: WorkbookError[] = [];
  for (const row of model.sourcing) {
    const isKindError = codes.plants.has(row.itemCode) || codes.products.has(row.itemCode) ||
      codes.suppliers.has(row.itemCode);
    if (!codes.plants.has(row.buyerCode) || !madeItems.has(row.itemCode) || isKindError) {
      continue;
    }
    errors.push(makeError('Sourcing', row.row, 'item_code', row.itemCode,
      `item "${row.itemCode}" has BOM children${rowNote(madeItems.get(row.itemCode), 'BOM')}, so ` +
      `it is made, and plant "${row.buyerCode}" also buys it here; an item may not be both ` +
      'made and bought at the same plant'));
  }
  return errors;
}

function rowNote(row: number | undefined, sheet: string): string {
  return row === undefined ? '' : ` (${sheet} row ${row})`;
}
