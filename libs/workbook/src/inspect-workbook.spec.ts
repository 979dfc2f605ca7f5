/**
 * The mapping step's inspection: sheets with a guessed header row, headers and samples, and per
 * template sheet the suggested file sheet, field matches and what is still missing. Expected
 * suggestions are worked out by hand from the names in field-aliases.ts.
 */
import { describe, expect, it } from 'vitest';
import { buildXlsx, smallNetworkSheets, toCsv, utf8, type SheetRows } from './fixture-workbooks';
import { inspectCsvFiles, inspectWorkbook } from './inspect-workbook';

describe('inspectWorkbook', () => {
  it('matches a template-shaped workbook completely', async () => {
    const inspection = await inspectWorkbook(await buildXlsx(smallNetworkSheets()));
    expect(inspection.errors).toEqual([]);
    expect(inspection.missingSheets).toEqual([]);
    expect(inspection.suggestions.Suppliers).toEqual({
      isRequired: true, sheetName: 'Suppliers', headerRow: 1,
      columns: Object.fromEntries(['supplier_code', 'supplier_name', 'country', 'region',
        'recovery_weeks', 'financial_health', 'delivery_score', 'has_continuity_plan']
        .map((field) => [field, field])),
      missingColumns: [], unmatchedHeaders: [],
    });
    const plants = inspection.sheets.find((sheet) => sheet.name === 'Plants');
    expect(plants).toEqual({ name: 'Plants', rowCount: 3, headerRow: 1,
      headers: ['plant_code', 'plant_name', 'country'],
      sampleRows: [['P1', 'Augsburg', 'DE'], ['P2', 'Suzhou', 'CN']],
      topRows: [
        { row: 1, cells: ['plant_code', 'plant_name', 'country'],
          headers: ['plant_code', 'plant_name', 'country'] },
        { row: 2, cells: ['P1', 'Augsburg', 'DE'], headers: ['P1', 'Augsburg', 'DE'] },
        { row: 3, cells: ['P2', 'Suzhou', 'CN'], headers: ['P2', 'Suzhou', 'CN'] },
      ] });
  });

  it('guesses a lower header row, a renamed sheet and renamed columns', async () => {
    const { Suppliers: _suppliers, ...others } = smallNetworkSheets();
    const vendors: SheetRows = [
      ['Vendor master export, 2024-05'],
      [],
      ['Vendor', 'Vendor name', 'Country', 'TTR', 'Rating'],
      ['S1', 'Müller Guss GmbH', 'DE', 12, 'A'],
      ['S2', '苏州精密', 'CN', 8, 'B'],
    ];
    const inspection = await inspectWorkbook(await buildXlsx({ ...others, Vendors: vendors }));
    const suggestion = inspection.suggestions.Suppliers;
    expect(suggestion.sheetName).toBe('Vendors');
    expect(suggestion.headerRow).toBe(3);
    expect(suggestion.columns).toEqual({ supplier_code: 'Vendor', supplier_name: 'Vendor name',
      country: 'Country', recovery_weeks: 'TTR' });
    expect(suggestion.unmatchedHeaders).toEqual(['Rating']);
    expect(suggestion.missingColumns).toEqual([]);
    const sheet = inspection.sheets.find((entry) => entry.name === 'Vendors');
    expect(sheet?.headerRow).toBe(3);
    expect(sheet?.sampleRows).toHaveLength(2);
    // The first non-blank rows with their own row numbers (row 2 is blank), so the mapping
    // step can preview another header row.
    expect(sheet?.topRows.map((row) => row.row)).toEqual([1, 3, 4, 5]);
    expect(sheet?.topRows[0]!.headers).toEqual(['Vendor master export, 2024-05']);
  });

  it('sends at most the first 25 non-blank rows of a sheet', async () => {
    const rows: SheetRows = [['plant_code', 'plant_name', 'country'],
      ...Array.from({ length: 40 }, (_, index) => [`P${index + 1}`, `Works ${index + 1}`, 'DE'])];
    const inspection = await inspectWorkbook(await buildXlsx({ ...smallNetworkSheets(),
      Plants: rows }));
    const plants = inspection.sheets.find((sheet) => sheet.name === 'Plants')!;
    expect(plants.rowCount).toBe(41);
    expect(plants.topRows).toHaveLength(25);
    expect(plants.topRows.at(-1)).toMatchObject({ row: 25, cells: ['P24', 'Works 24', 'DE'] });
  });

  it('lists the required sheets and columns still missing', async () => {
    const sheets: Record<string, SheetRows> = {
      Plants: [['plant_code'], ['P1']],
      Products: [['product_code', 'product_name'], ['F1', 'Pump']],
    };
    const inspection = await inspectWorkbook(await buildXlsx(sheets));
    expect(inspection.missingSheets).toEqual(['BOM', 'Suppliers', 'Sourcing']);
    expect(inspection.suggestions.Products.missingColumns)
      .toEqual(['plant_code', 'weekly_revenue']);
    expect(inspection.suggestions.Stock).toMatchObject({ isRequired: false, sheetName: null });
  });

  it('applies a mapping chosen so far', async () => {
    const inspection = await inspectWorkbook(await buildXlsx(smallNetworkSheets()), {
      mapping: { Plants: { columns: { plant_name: 'country' } } },
    });
    expect(inspection.suggestions.Plants.columns).toEqual({ plant_code: 'plant_code',
      plant_name: 'country' });
  });

  it('reports a file that is not a spreadsheet without throwing', async () => {
    const inspection = await inspectWorkbook(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 1, 2]));
    expect(inspection.errors.map((error) => error.message)).toEqual([
      'not a spreadsheet: the file is a PNG image',
    ]);
    expect(inspection.sheets).toEqual([]);
    expect(inspection.missingSheets).toEqual(['Plants', 'Products', 'BOM', 'Suppliers',
      'Sourcing']);
  });

  it('inspects CSV files given one by one', async () => {
    const inspection = await inspectCsvFiles([
      { name: 'sites.csv', data: utf8(toCsv([['Site', 'Name'], ['P1', 'Augsburg']])) },
    ]);
    expect(inspection.suggestions.Plants).toMatchObject({ sheetName: 'sites', headerRow: 1,
      columns: { plant_code: 'Site', plant_name: 'Name' } });
  });
});

describe('readWorkbook with inspect: true', () => {
  it('gives the same inspection as inspectWorkbook, from one parse', async () => {
    const sheets = smallNetworkSheets();
    sheets['Vendors'] = sheets['Suppliers']!;
    delete sheets['Suppliers'];
    const data = await buildXlsx(sheets);
    const { readWorkbook } = await import('./read-workbook');
    const read = await readWorkbook(data, { inspect: true });
    expect(read.inspection).toEqual(await inspectWorkbook(data));
    expect(read.inspection?.missingSheets).not.toContain('Plants');
    expect(read.errors.some((error) => /Suppliers/.test(error.message))).toBe(true);
    expect((await readWorkbook(data)).inspection).toBeUndefined();
  });

  it('inspects a file that is not a spreadsheet as one with no sheets and the same error', async () => {
    const { readWorkbook } = await import('./read-workbook');
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 1, 2, 3]);
    const read = await readWorkbook(png, { inspect: true, fileName: 'suppliers.xlsx' });
    expect(read.inspection?.sheets).toEqual([]);
    expect(read.inspection?.errors).toEqual(read.errors);
  });
});
