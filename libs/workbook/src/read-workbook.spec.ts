/**
 * readWorkbook on whole files built in code: the happy path, header and sheet name variants,
 * missing sheets and columns, empty workbooks, formula, rich-text and hyperlink cells, files
 * that are not spreadsheets, the row limit and the collection of every error. Expected models
 * and errors are worked out by hand from spec sections 1 and 8.
 */
import { describe, expect, it } from 'vitest';
import {
  buildXlsx,
  smallNetworkModel,
  smallNetworkSheets,
  type SheetRows,
} from './fixture-workbooks';
import { readWorkbook } from './read-workbook';

const PNG_MAGIC = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** Deterministic pseudo-random bytes (the 32-bit LCG constants of Numerical Recipes). */
function randomBytes(length: number, seed: number): Uint8Array {
  const bytes = new Uint8Array(length);
  let state = seed >>> 0;
  for (let index = 0; index < length; index += 1) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    bytes[index] = state >>> 24;
  }
  return bytes;
}

function withSheet(name: string, rows: SheetRows): Record<string, SheetRows> {
  return { ...smallNetworkSheets(), [name]: rows };
}

describe('readWorkbook: the happy path', () => {
  it('reads a small full workbook into the expected model', async () => {
    const result = await readWorkbook(await buildXlsx(smallNetworkSheets()));
    expect(result.errors).toEqual([]);
    expect(result.warnings).toEqual([]);
    expect(result.format).toBe('xlsx');
    expect(result.counts).toEqual({
      Plants: 2, Products: 2, BOM: 3, Suppliers: 3, Sourcing: 4, Stock: 1,
    });
    expect(result.model).toStrictEqual(smallNetworkModel());
  });

  it('accepts a workbook without the optional Stock sheet (no stock)', async () => {
    const { Stock: _stock, ...sheets } = smallNetworkSheets();
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([]);
    expect(result.model?.stock).toEqual([]);
    expect(result.counts.Stock).toBeUndefined();
  });

  it('ignores other sheets and keeps extra columns as attributes', async () => {
    const sheets = smallNetworkSheets();
    sheets['Plants'] = [
      ['plant_code', 'plant_name', 'country', 'Cost centre'],
      ['P1', 'Augsburg', 'DE', 4711],
      ['P2', 'Suzhou', 'CN', null],
    ];
    const result = await readWorkbook(await buildXlsx({ Notes: [['hello']], ...sheets }));
    expect(result.errors).toEqual([]);
    expect(result.model?.plants[0]).toEqual({ code: 'P1', name: 'Augsburg', country: 'DE', row: 2,
      attributes: { 'Cost centre': '4711' } });
    expect(result.model?.plants[1]).not.toHaveProperty('attributes');
  });

  it('skips blank rows but keeps the row numbers of the file', async () => {
    const sheets = withSheet('Plants', [
      ['plant_code', 'plant_name', 'country'],
      ['P1', 'Augsburg', 'DE'],
      [null, '   ', null],
      [],
      ['P2', 'Suzhou', 'CN'],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([]);
    expect(result.counts.Plants).toBe(2);
    expect(result.model?.plants.map((plant) => plant.row)).toEqual([2, 5]);
  });
});

describe('readWorkbook: names of sheets and headers', () => {
  it.each([
    ['Supplier Code'], ['SUPPLIER_CODE'], ['suppliercode'], [' supplier  code '], ['Supplier_Code'],
  ])('matches the header %j to supplier_code', async (header) => {
    const sheets = smallNetworkSheets();
    const suppliers = sheets['Suppliers'] as SheetRows;
    sheets['Suppliers'] = [[header, ...(suppliers[0] as string[]).slice(1)], ...suppliers.slice(1)];
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([]);
    expect(result.model?.suppliers.map((supplier) => supplier.code)).toEqual(['S1', 'S2', 'S3']);
  });

  it('matches sheet names by case, spaces and underscores', async () => {
    const sheets = smallNetworkSheets();
    const renamed = { plants: sheets['Plants'], PRODUCTS: sheets['Products'], b_o_m: sheets['BOM'],
      ' Suppliers ': sheets['Suppliers'], Sourcing: sheets['Sourcing'], 'S tock': sheets['Stock'] };
    const result = await readWorkbook(await buildXlsx(renamed as Record<string, SheetRows>));
    expect(result.errors).toEqual([]);
    expect(result.model).toStrictEqual(smallNetworkModel());
  });

  it('reports two headers that map to one field at the later header cell', async () => {
    const sheets = withSheet('Plants', [
      ['plant_code', 'plant_name', 'Plant Code'],
      ['P1', 'Augsburg', 'P1'],
      ['P2', 'Suzhou', 'P2'],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.model).toBeNull();
    expect(result.errors).toEqual([{ sheet: 'Plants', row: 1, column: 'plant_code',
      value: 'Plant Code', cell: 'C1',
      message: 'two headers map to plant_code: "plant_code" and "Plant Code"; keep one' }]);
  });
});

describe('readWorkbook: missing and empty parts', () => {
  it('reports a missing required sheet with row and column null', async () => {
    const { BOM: _bom, ...sheets } = smallNetworkSheets();
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.model).toBeNull();
    expect(result.errors).toEqual([
      { sheet: 'BOM', row: null, column: null, value: null, message: 'the sheet BOM is missing' },
    ]);
  });

  it('reports a missing required column at the header row', async () => {
    const sheets = withSheet('Products', [
      ['product_code', 'plant_code', 'product_name'],
      ['F1', 'P1', 'Pump housing'],
      ['F2', 'P2', 'Valve'],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([{ sheet: 'Products', row: 1, column: 'weekly_revenue',
      value: null,
      message: 'the required column weekly_revenue is missing (headers are read from row 1)' }]);
  });

  it('does not repeat a missing code column as reference errors elsewhere', async () => {
    const sheets = withSheet('Suppliers', [['supplier_name'], ['Müller Guss GmbH']]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors.map((error) => [error.sheet, error.column])).toEqual([
      ['Suppliers', 'supplier_code'],
    ]);
  });

  it('reports an empty workbook clearly', async () => {
    const result = await readWorkbook(await buildXlsx({ Sheet1: [] }));
    expect(result.model).toBeNull();
    expect(result.errors.map((error) => error.message)).toEqual([
      "the file holds none of the template's sheets (Plants, Products, BOM, Suppliers, " +
        'Sourcing, Stock)',
      'the sheet Plants is missing',
      'the sheet Products is missing',
      'the sheet BOM is missing',
      'the sheet Suppliers is missing',
      'the sheet Sourcing is missing',
    ]);
  });

  it('reports required sheets without headers, and sheets with headers but no rows', async () => {
    const sheets: Record<string, SheetRows> = {
      Plants: [['plant_code']], Products: [], BOM: [['parent_code', 'child_code']],
      Suppliers: [['supplier_code']], Sourcing: [['buyer_code', 'item_code', 'supplier_code']],
    };
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors.map((error) => [error.sheet, error.row, error.message])).toEqual([
      ['Plants', null, 'the sheet Plants has no data rows below its headers'],
      ['Products', 1, 'the sheet has no headers in row 1'],
    ]);
  });
});

describe('readWorkbook: cell kinds', () => {
  it('uses the cached result of a formula and reports #REF! at its cell', async () => {
    const sheets = withSheet('Products', [
      ['product_code', 'plant_code', 'product_name', 'weekly_revenue'],
      ['F1', 'P1', 'Pump housing', { formula: '500*2', result: 1000 }],
      ['F2', 'P2', 'Valve', { formula: 'Sheet9!A1', result: { error: '#REF!' } }],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([{ sheet: 'Products', row: 3, column: 'weekly_revenue',
      value: '#REF!', cell: 'D3',
      message: 'weekly_revenue: the cell holds the error value #REF!' }]);
  });

  it('reads rich text and hyperlink cells by their text, and integer codes as digits', async () => {
    const sheets = withSheet('Plants', [
      ['plant_code', 'plant_name', 'country'],
      [{ richText: [{ text: 'P', font: { bold: true } }, { text: '1' }] },
        { text: 'Augsburg', hyperlink: 'https://example.com/augsburg' }, 'DE'],
      ['P2', 'Suzhou', 'CN'],
      [1001.0, 'Numbered plant', 'US'],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors).toEqual([]);
    expect(result.model?.plants.map((plant) => [plant.code, plant.name])).toEqual([
      ['P1', 'Augsburg'], ['P2', 'Suzhou'], ['1001', 'Numbered plant'],
    ]);
  });

  it('reports a date in a number column and a blank weekly_revenue', async () => {
    const sheets = withSheet('Products', [
      ['product_code', 'plant_code', 'product_name', 'weekly_revenue'],
      ['F1', 'P1', 'Pump housing', new Date(Date.UTC(2024, 0, 2))],
      ['F2', 'P2', 'Valve', null],
    ]);
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.errors.map((error) => [error.row, error.cell, error.message])).toEqual([
      [2, 'D2', 'weekly_revenue: expected a number; got a date (format the cell as a number)'],
      [3, 'D3', 'weekly_revenue: this column is required; the cell is blank'],
    ]);
  });
});

describe('readWorkbook: input that is not a spreadsheet', () => {
  it('refuses a PNG by its magic bytes', async () => {
    const png = new Uint8Array([...PNG_MAGIC, ...randomBytes(200, 7)]);
    const result = await readWorkbook(png, { fileName: 'network.xlsx' });
    expect(result).toEqual({ model: null, warnings: [], counts: {}, format: 'csv', errors: [
      { sheet: null, row: null, column: null, value: null,
        message: 'not a spreadsheet: the file is a PNG image' }] });
  });

  it.each([[1], [2], [3]])('refuses random bytes (seed %d)', async (seed) => {
    const result = await readWorkbook(randomBytes(4096, seed));
    expect(result.model).toBeNull();
    expect(result.errors).toHaveLength(1);
    expect(result.errors[0]?.message).toMatch(/^not a spreadsheet/u);
  });

  it('refuses an empty file and an old .xls file', async () => {
    expect((await readWorkbook(new Uint8Array(0))).errors[0]?.message).toBe('the file is empty');
    const xls = new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0]);
    expect((await readWorkbook(xls)).errors[0]?.message).toMatch(/old-format Excel \(\.xls\)/u);
  });
});

describe('readWorkbook: limits and completeness', () => {
  it('stops at the row limit over all sheets', async () => {
    const result = await readWorkbook(await buildXlsx(smallNetworkSheets()),
      { limits: { maxRows: 12 } });
    expect(result.errors).toEqual([{ sheet: null, row: null, column: null, value: null,
      message: 'the file has more than 12 rows; the limit is 12' }]);
  });

  it('returns every error of a workbook with six different ones, at their rows', async () => {
    const sheets = smallNetworkSheets();
    sheets['Products'] = [
      ['product_code', 'plant_code', 'product_name', 'weekly_revenue'],
      ['F1', 'P1', 'Pump housing', '12,00'],
      ['F2', 'P9', 'Valve', 2500],
    ];
    sheets['BOM'] = [
      ['parent_code', 'child_code', 'qty_per'],
      ['F1', 'A', 2],
      ['A', 'C1', -1],
      ['F2', 'B', 3],
      ['F2', 'B', 1],
    ];
    sheets['Suppliers'] = [
      ...(smallNetworkSheets()['Suppliers'] as SheetRows),
      ['S1', 'Copy of S1', 'DE', '', 8, 3, 3, 'maybe'],
    ];
    const result = await readWorkbook(await buildXlsx(sheets));
    expect(result.model).toBeNull();
    expect(result.errors.map((error) => [error.sheet, error.row, error.column, error.cell]))
      .toEqual([
        ['Products', 2, 'weekly_revenue', 'D2'],
        ['Products', 3, 'plant_code', 'B3'],
        ['BOM', 3, 'qty_per', 'C3'],
        ['BOM', 5, 'child_code', 'B5'],
        ['Suppliers', 5, 'supplier_code', 'A5'],
        ['Suppliers', 5, 'has_continuity_plan', 'H5'],
      ]);
    expect(result.errors[3]?.message).toBe(
      'duplicate: parent_code "F2", child_code "B" already appears in row 4');
  });
});
