/**
 * Reading files that are not laid out like the template (the mapping option), and CSV input:
 * one CSV file, CSV files given one by one, and a zip of CSV files. Expected models come from
 * the hand-made small network of fixture-workbooks.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  buildXlsx,
  buildZip,
  smallNetworkModel,
  smallNetworkSheets,
  toCsv,
  utf8,
  type SheetRows,
} from './fixture-workbooks';
import { readCsvFiles, readWorkbook } from './read-workbook';

function csvFiles(): { name: string; data: Uint8Array }[] {
  return Object.entries(smallNetworkSheets()).map(([name, rows]) => ({
    name: `${name}.csv`, data: utf8(toCsv(rows)),
  }));
}

describe('readWorkbook with a mapping', () => {
  it('reads a renamed sheet with headers in row 3 and renamed columns', async () => {
    const sheets = smallNetworkSheets();
    const { Suppliers: suppliers, ...others } = sheets;
    const renamed: SheetRows = [
      ['Vendor master export'],
      [],
      ['Vendor No.', 'Vendor', 'country', 'region', 'TTR (weeks)', 'financial_health',
        'delivery_score', 'BCP'],
      ...(suppliers as SheetRows).slice(1),
    ];
    const xlsx = await buildXlsx({ ...others, 'Vendor list': renamed });
    const mapping = {
      Suppliers: {
        sheetName: 'Vendor list', headerRow: 3,
        columns: { supplier_code: 'Vendor No.', supplier_name: 'vendor',
          recovery_weeks: 'TTR (weeks)', has_continuity_plan: 'BCP' },
      },
    };
    const result = await readWorkbook(xlsx, { mapping });
    expect(result.errors).toEqual([]);
    const expected = smallNetworkModel();
    expected.suppliers.forEach((supplier, index) => { supplier.row = index + 4; });
    expect(result.model).toStrictEqual(expected);
  });

  it('reports a mapped header that is not there, and a mapped sheet that is missing', async () => {
    const xlsx = await buildXlsx(smallNetworkSheets());
    const result = await readWorkbook(xlsx, { mapping: {
      Plants: { columns: { plant_code: 'Werk' } },
      Stock: { sheetName: 'Lager' },
      BOM: { sheetName: 'Stückliste' },
    } });
    expect(result.errors.map((error) => [error.sheet, error.row, error.column, error.message]))
      .toEqual([
        ['Plants', 1, 'plant_code', 'the header "Werk" chosen for plant_code is not in row 1'],
        ['BOM', null, null, 'the sheet "Stückliste" chosen for BOM is not in the file'],
        ['Stock', null, null, 'the sheet "Lager" chosen for Stock is not in the file'],
      ]);
  });

  it('reports locations in the file: sheet name, row and cell under the mapping', async () => {
    const sheets = smallNetworkSheets();
    const { Plants: plants, ...others } = sheets;
    const moved: SheetRows = [[], ['Site', 'Name', 'Land'], ...(plants as SheetRows).slice(1)];
    moved.push(['P2', 'Again', 'CN']);
    const result = await readWorkbook(await buildXlsx({ Sites: moved, ...others }), {
      mapping: { Plants: { sheetName: 'Sites', headerRow: 2,
        columns: { plant_code: 'Site', plant_name: 'Name', country: 'Land' } } },
    });
    expect(result.errors).toEqual([{ sheet: 'Sites', row: 5, column: 'plant_code', value: 'P2',
      cell: 'A5', message: 'duplicate: plant_code "P2" already appears in row 4' }]);
  });
});

describe('CSV input', () => {
  it('reads CSV files given one by one into the same model as the workbook', async () => {
    const result = await readCsvFiles(csvFiles());
    expect(result.errors).toEqual([]);
    expect(result.format).toBe('csv');
    expect(result.model).toStrictEqual(smallNetworkModel());
  });

  it('reads a zip of CSV files (in a folder, with a byte-order mark)', async () => {
    const files: Record<string, Uint8Array> = {};
    for (const file of csvFiles()) {
      files[`export/${file.name.toLowerCase()}`] = new Uint8Array([0xef, 0xbb, 0xbf, ...file.data]);
    }
    files['__MACOSX/export/._plants.csv'] = new Uint8Array([0, 5, 22, 7]);
    const result = await readWorkbook(buildZip(files));
    expect(result.errors).toEqual([]);
    expect(result.format).toBe('zip');
    expect(result.model).toStrictEqual(smallNetworkModel());
  });

  it('keeps quoted commas and reads numbers written as text', async () => {
    const files = csvFiles();
    files[1] = { name: 'Products.csv', data: utf8('product_code,plant_code,product_name,' +
      'weekly_revenue\r\nF1,P1,"Pump housing, large","1,000"\r\nF2,P2,Valve, 2500 \r\n') };
    const result = await readCsvFiles(files);
    expect(result.errors).toEqual([]);
    expect(result.model?.products.map((p) => [p.name, p.weeklyRevenue])).toEqual([
      ['Pump housing, large', 1000], ['Valve', 2500],
    ]);
  });

  it('reads a single CSV file as the sheet its file name gives', async () => {
    const plants = utf8(toCsv(smallNetworkSheets()['Plants'] as SheetRows));
    const result = await readWorkbook(plants, { fileName: 'Plants.csv' });
    expect(result.format).toBe('csv');
    expect(result.counts).toEqual({ Plants: 2 });
    expect(result.errors.map((error) => error.message)).toEqual([
      'the sheet Products is missing', 'the sheet BOM is missing', 'the sheet Suppliers is missing',
      'the sheet Sourcing is missing',
    ]);
  });

  it('does not take ";" as a separator: the headers do not match', async () => {
    const files = csvFiles();
    files[0] = { name: 'Plants.csv', data: utf8('plant_code;plant_name\r\nP1;Augsburg\r\n') };
    const result = await readCsvFiles(files);
    expect(result.errors[0]).toEqual({ sheet: 'Plants', row: 1, column: 'plant_code', value: null,
      message: 'the required column plant_code is missing (headers are read from row 1)' });
  });

  it('reports an unclosed quote at its row and keeps reading the other files', async () => {
    const files = csvFiles();
    files[2] = { name: 'BOM.csv', data: utf8('parent_code,child_code\r\nF1,"A\r\n') };
    const result = await readCsvFiles(files);
    expect(result.errors[0]).toEqual({ sheet: 'BOM', row: 2, column: null, value: null,
      message: 'a quoted field is never closed (a " is missing)' });
  });

  it('stops at the row limit over all CSV files', async () => {
    const result = await readCsvFiles(csvFiles(), { limits: { maxRows: 10 } });
    expect(result.errors).toEqual([{ sheet: null, row: null, column: null, value: null,
      message: 'the file has more than 10 rows; the limit is 10' }]);
  });
});
