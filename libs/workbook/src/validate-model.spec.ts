/**
 * Model rules on models built in code (spec 8.4, 8.7-8.10, 8.16), each case changing the small
 * hand-made network of fixture-workbooks.ts in one place. Expected errors and warnings are
 * worked out by hand from the spec.
 */
import type { SupplyModel } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { buildXlsx, smallNetworkModel, smallNetworkSheets } from './fixture-workbooks';
import { readWorkbook } from './read-workbook';
import { validateModel } from './validate-model';

function changed(change: (model: SupplyModel) => void): SupplyModel {
  const model = smallNetworkModel();
  change(model);
  return model;
}

const brief = (model: SupplyModel) =>
  validateModel(model).errors.map((error) => [error.sheet, error.row, error.column, error.value]);

describe('validateModel: the valid network', () => {
  it('finds nothing wrong with the small network', () => {
    expect(validateModel(smallNetworkModel())).toEqual({ errors: [], warnings: [] });
  });

  it('does not change the model it checks', () => {
    const model = smallNetworkModel();
    validateModel(model);
    expect(model).toStrictEqual(smallNetworkModel());
  });
});

describe('validateModel: ranges (spec 8.4)', () => {
  it.each([
    ['weekly_revenue < 0', (m: SupplyModel) => { m.products[0]!.weeklyRevenue = -1; },
      ['Products', 2, 'weekly_revenue', -1], 'weekly_revenue: must be 0 or more; got -1'],
    ['qty_per = 0', (m: SupplyModel) => { m.bom[0]!.qtyPer = 0; },
      ['BOM', 2, 'qty_per', 0], 'qty_per: must be more than 0; got 0'],
    ['recovery_weeks < 0', (m: SupplyModel) => { m.suppliers[0]!.recoveryWeeks = -2; },
      ['Suppliers', 2, 'recovery_weeks', -2], 'recovery_weeks: must be 0 or more; got -2'],
    ['weeks_of_cover < 0', (m: SupplyModel) => { m.stock[0]!.weeksOfCover = -0.5; },
      ['Stock', 2, 'weeks_of_cover', -0.5], 'weeks_of_cover: must be 0 or more; got -0.5'],
    ['share_pct > 100', (m: SupplyModel) => { m.sourcing[0]!.sharePct = 101; },
      ['Sourcing', 2, 'share_pct', 101], 'share_pct: must be from 0 to 100; got 101'],
    ['share_pct < 0', (m: SupplyModel) => { m.sourcing[0]!.sharePct = -1; },
      ['Sourcing', 2, 'share_pct', -1], 'share_pct: must be from 0 to 100; got -1'],
    ['financial_health 0', (m: SupplyModel) => { m.suppliers[0]!.financialHealth = 0; },
      ['Suppliers', 2, 'financial_health', 0], 'financial_health: must be from 1 to 5; got 0'],
    ['delivery_score 6', (m: SupplyModel) => { m.suppliers[0]!.deliveryScore = 6; },
      ['Suppliers', 2, 'delivery_score', 6], 'delivery_score: must be from 1 to 5; got 6'],
    ['NaN revenue', (m: SupplyModel) => { m.products[1]!.weeklyRevenue = Number.NaN; },
      ['Products', 3, 'weekly_revenue', Number.NaN], 'weekly_revenue: expected a finite number'],
  ])('reports %s', (_label, change, located, message) => {
    const { errors } = validateModel(changed(change));
    expect(errors.map((error) => [error.sheet, error.row, error.column, error.value]))
      .toEqual([located]);
    expect(errors[0]?.message).toBe(message);
  });

  it('accepts the bounds themselves (0 revenue, 0 and 100 share, 1 and 5 scores)', () => {
    const model = changed((m) => {
      m.products[0]!.weeklyRevenue = 0;
      m.sourcing[0]!.sharePct = 0;
      m.sourcing[1]!.sharePct = 100;
      m.suppliers[0]!.financialHealth = 1;
      m.suppliers[0]!.deliveryScore = 5;
      m.suppliers[1]!.recoveryWeeks = 0;
    });
    expect(validateModel(model).errors).toEqual([]);
  });
});

describe('validateModel: duplicates (spec 8.7) at the later row', () => {
  it.each([
    ['Plants', (m: SupplyModel) => m.plants.push({ code: 'P1', name: '', country: '', row: 4 }),
      ['Plants', 4, 'plant_code', 'P1']],
    ['Products', (m: SupplyModel) => m.products.push({ code: 'F2', plantCode: 'P1', name: '',
      weeklyRevenue: 1, row: 4 }), ['Products', 4, 'product_code', 'F2']],
    ['Suppliers', (m: SupplyModel) => m.suppliers.push({ ...m.suppliers[2]!, row: 5 }),
      ['Suppliers', 5, 'supplier_code', 'S3']],
    ['BOM', (m: SupplyModel) => m.bom.push({ parentCode: 'A', childCode: 'C1', qtyPer: 4, row: 5 }),
      ['BOM', 5, 'child_code', 'C1']],
    ['Sourcing', (m: SupplyModel) => m.sourcing.push({ ...m.sourcing[0]!, sharePct: 5, row: 6 }),
      ['Sourcing', 6, 'supplier_code', 'S1']],
    ['Stock', (m: SupplyModel) => m.stock.push({ plantCode: 'P1', itemCode: 'C1', weeksOfCover: 1,
      row: 3 }), ['Stock', 3, 'item_code', 'C1']],
  ])('reports a duplicate key in %s', (_sheet, change, located) => {
    expect(brief(changed(change))).toEqual([located]);
  });

  it('names the earlier row in the message', () => {
    const model = changed((m) => m.stock.push({ plantCode: 'P1', itemCode: 'C1', weeksOfCover: 1,
      row: 9 }));
    expect(validateModel(model).errors[0]?.message).toBe(
      'duplicate: plant_code "P1", item_code "C1" already appears in row 2');
  });

  it('allows the same (buyer, item) from two suppliers', () => {
    const model = changed((m) => m.sourcing.push({ buyerCode: 'P2', itemCode: 'B',
      supplierCode: 'S1', sharePct: null, isQualified: true, row: 6 }));
    expect(validateModel(model).errors).toEqual([]);
  });
});

describe('validateModel: kinds and references (spec 8.8)', () => {
  it('reports a product code that is already a plant code at Products', () => {
    const model = changed((m) => { m.products[1]!.code = 'P2'; });
    expect(brief(model)).toEqual([['Products', 3, 'product_code', 'P2']]);
    expect(validateModel(model).errors[0]?.message).toBe(
      'product_code "P2" is already a plant code (Plants row 3); a code may name only one kind');
  });

  it('reports a supplier code that is already a product code at Suppliers', () => {
    const model = changed((m) => {
      m.suppliers[2]!.code = 'F1';
      m.sourcing[3]!.supplierCode = 'F1';
    });
    expect(brief(model)).toEqual([['Suppliers', 4, 'supplier_code', 'F1']]);
  });

  it.each([
    ['a product as BOM child', (m: SupplyModel) => { m.bom[1]!.childCode = 'F2'; },
      [['BOM', 3, 'child_code', 'F2']]],
    ['a plant as BOM parent', (m: SupplyModel) => { m.bom[1]!.parentCode = 'P1'; },
      [['BOM', 3, 'parent_code', 'P1']]],
    ['a supplier as Sourcing item', (m: SupplyModel) => { m.sourcing[3]!.itemCode = 'S2'; },
      [['Sourcing', 5, 'item_code', 'S2']]],
    ['a plant as Stock item', (m: SupplyModel) => { m.stock[0]!.itemCode = 'P2'; },
      [['Stock', 2, 'item_code', 'P2']]],
    ['Products.plant_code not a plant', (m: SupplyModel) => { m.products[0]!.plantCode = 'P7'; },
      [['Products', 2, 'plant_code', 'P7']]],
    ['Sourcing.buyer_code neither plant nor supplier',
      (m: SupplyModel) => { m.sourcing[3]!.buyerCode = 'X1'; },
      [['Sourcing', 5, 'buyer_code', 'X1']]],
    ['Sourcing.supplier_code not a supplier',
      (m: SupplyModel) => { m.sourcing[2]!.supplierCode = 'S9'; },
      [['Sourcing', 4, 'supplier_code', 'S9']]],
    ['Stock.plant_code not a plant', (m: SupplyModel) => { m.stock[0]!.plantCode = 'S1'; },
      [['Stock', 2, 'plant_code', 'S1']]],
  ])('reports %s', (_label, change, expected) => {
    expect(brief(changed(change))).toEqual(expected);
  });

  it('ignores a Stock row for an item the plant does not use', () => {
    const model = changed((m) => m.stock.push({ plantCode: 'P2', itemCode: 'C1', weeksOfCover: 3,
      row: 3 }));
    expect(validateModel(model).errors).toEqual([]);
  });
});

describe('validateModel: made and bought (spec 8.9)', () => {
  it('reports a plant buying an item that has BOM children, at the Sourcing item cell', () => {
    const model = changed((m) => m.sourcing.push({ buyerCode: 'P1', itemCode: 'A',
      supplierCode: 'S1', sharePct: null, isQualified: true, row: 6 }));
    expect(brief(model)).toEqual([['Sourcing', 6, 'item_code', 'A']]);
    expect(validateModel(model).errors[0]?.message).toBe(
      'item "A" has BOM children (BOM row 3), so it is made, and plant "P1" also buys it here; ' +
        'an item may not be both made and bought at the same plant');
  });

  it('lets a supplier buy an item that has BOM children', () => {
    const model = changed((m) => m.sourcing.push({ buyerCode: 'S1', itemCode: 'A',
      supplierCode: 'S3', sharePct: null, isQualified: true, row: 6 }));
    expect(validateModel(model).errors).toEqual([]);
  });
});

describe('validateModel: BOM cycles (spec 8.10)', () => {
  it('reports every row of a three-item cycle and names the cycle', () => {
    const model = changed((m) => {
      m.bom.push({ parentCode: 'A', childCode: 'X', qtyPer: 1, row: 5 });
      m.bom.push({ parentCode: 'X', childCode: 'Y', qtyPer: 1, row: 6 });
      m.bom.push({ parentCode: 'Y', childCode: 'A', qtyPer: 1, row: 7 });
    });
    const { errors } = validateModel(model);
    expect(errors.map((error) => [error.row, error.column, error.value, error.message])).toEqual([
      [5, 'child_code', 'X', 'BOM cycle: A -> X -> Y -> A'],
      [6, 'child_code', 'Y', 'BOM cycle: A -> X -> Y -> A'],
      [7, 'child_code', 'A', 'BOM cycle: A -> X -> Y -> A'],
    ]);
  });

  it('reports a self-loop and leaves the rows outside the cycle alone', () => {
    const model = changed((m) => {
      m.bom.push({ parentCode: 'A', childCode: 'X', qtyPer: 1, row: 5 });
      m.bom.push({ parentCode: 'X', childCode: 'X', qtyPer: 1, row: 6 });
    });
    expect(validateModel(model).errors.map((error) => [error.row, error.message])).toEqual([
      [6, 'BOM cycle: X -> X'],
    ]);
  });

  it('names the shortest cycle through each row when two loops share items', () => {
    // A -> X -> A and A -> X -> E -> A share the line A -> X.
    const model = changed((m) => {
      m.bom.push({ parentCode: 'A', childCode: 'X', qtyPer: 1, row: 5 });
      m.bom.push({ parentCode: 'X', childCode: 'A', qtyPer: 1, row: 6 });
      m.bom.push({ parentCode: 'X', childCode: 'E', qtyPer: 1, row: 7 });
      m.bom.push({ parentCode: 'E', childCode: 'A', qtyPer: 1, row: 8 });
    });
    expect(validateModel(model).errors.map((error) => [error.row, error.message])).toEqual([
      [5, 'BOM cycle: A -> X -> A'],
      [6, 'BOM cycle: A -> X -> A'],
      [7, 'BOM cycle: A -> X -> E -> A'],
      [8, 'BOM cycle: A -> X -> E -> A'],
    ]);
  });

  it('handles a deep chain without overflowing the stack', () => {
    const model = smallNetworkModel();
    for (let depth = 0; depth < 50_000; depth += 1) {
      model.bom.push({ parentCode: `L${depth}`, childCode: `L${depth + 1}`, qtyPer: 1 });
    }
    model.bom.push({ parentCode: 'L50000', childCode: 'L0', qtyPer: 1 });
    const { errors } = validateModel(model);
    expect(errors).toHaveLength(50_001);
    expect(errors[0]?.message)
      .toMatch(/^BOM cycle: L\d+ -> L\d+ lies on a loop among 50001 codes/u);
  });
});

describe('validateModel: warnings (spec 8.16)', () => {
  it('warns of a product with no BOM rows', () => {
    const model = changed((m) => m.products.push({ code: 'F3', plantCode: 'P1', name: '',
      weeklyRevenue: 10, row: 4 }));
    expect(validateModel(model).warnings).toEqual([{ sheet: 'Products', row: 4,
      kind: 'product-no-bom',
      message: 'product "F3" has no BOM rows, so no supplier failure can affect it' }]);
  });

  it('warns of a supplier that no qualified row buys from', () => {
    const model = changed((m) => { m.sourcing[0]!.isQualified = false; });
    const warnings = validateModel(model).warnings;
    // Sorted by sheet in workbook order: Suppliers comes before Sourcing.
    expect(warnings.map((w) => [w.sheet, w.row, w.kind])).toEqual([
      ['Suppliers', 2, 'supplier-unused'],
      ['Sourcing', 2, 'unsourced'],
    ]);
  });

  it('puts an unsourced warning on the first Sourcing row of the (buyer, item)', () => {
    const model = changed((m) => {
      m.sourcing[0]!.isQualified = false;
      m.sourcing.push({ buyerCode: 'P1', itemCode: 'C1', supplierCode: 'S3', sharePct: null,
        isQualified: false, row: 6 });
    });
    const unsourced = validateModel(model).warnings.filter((w) => w.kind === 'unsourced');
    expect(unsourced).toEqual([{ sheet: 'Sourcing', row: 2, kind: 'unsourced',
      message: 'item "C1" bought by "P1" has no qualified source, so it counts as lost even ' +
        'before any failure' }]);
  });

  it('puts it on the first BOM row that brings a leaf item to a plant with no Sourcing row', () => {
    const model = changed((m) => {
      m.bom.push({ parentCode: 'F1', childCode: 'G', qtyPer: 1, row: 5 });
      m.bom.push({ parentCode: 'A', childCode: 'G', qtyPer: 1, row: 6 });
    });
    expect(validateModel(model).warnings).toEqual([{ sheet: 'BOM', row: 5, kind: 'unsourced',
      message: 'plant "P1" needs item "G" (through its BOM) but has no Sourcing row for it, so ' +
        'it counts as lost even before any failure' }]);
  });

  it('warns per plant when a shared item is sourced at one plant only', () => {
    // B is bought by P2 (Sourcing row 4); once F1 also needs B, plant P1 has no source for it.
    const model = changed((m) => m.bom.push({ parentCode: 'A', childCode: 'B', qtyPer: 1,
      row: 5 }));
    expect(validateModel(model).warnings.map((w) => [w.sheet, w.row, w.kind, w.message]))
      .toEqual([['BOM', 5, 'unsourced', 'plant "P1" needs item "B" (through its BOM) but has no ' +
        'Sourcing row for it, so it counts as lost even before any failure']]);
  });

  it('reports warnings from a file at the file sheet and row, sorted', async () => {
    const sheets = smallNetworkSheets();
    sheets['Products']!.push(['F3', 'P1', 'Spare', 5]);
    sheets['Suppliers']!.push(['S4', 'Idle', 'FR', '', 4, 3, 3, 'no']);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([]);
    expect(result.model).not.toBeNull();
    expect(result.warnings.map((w) => [w.sheet, w.row, w.kind])).toEqual([
      ['Products', 4, 'product-no-bom'],
      ['Suppliers', 5, 'supplier-unused'],
    ]);
  });
});
