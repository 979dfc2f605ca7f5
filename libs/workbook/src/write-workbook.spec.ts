/**
 * Writing: a valid model written and read back is the same model (rows, attributes, nulls and
 * non-ASCII text included), and the empty template documents every column in its "Read me"
 * sheet. Files are read back with exceljs itself to check what a spreadsheet program would see.
 */
import { SHEET_NAMES, type SupplyModel } from '@keelson/contracts';
import ExcelJS from 'exceljs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { smallNetworkModel } from './fixture-workbooks';
import { readWorkbook } from './read-workbook';
import { TEMPLATE_FIELDS } from './template-fields';
import { validateModel } from './validate-model';
import { writeTemplate, writeWorkbook } from './write-workbook';

async function openWorkbook(bytes: Uint8Array): Promise<ExcelJS.Workbook> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
    bytes.byteOffset + bytes.byteLength) as ArrayBuffer as never);
  return workbook;
}

/** The small network with attributes, codes that look like numbers and unusual text. */
function richModel(): SupplyModel {
  const model = smallNetworkModel();
  model.plants[0]!.attributes = { 'Cost centre': '4711', Manager: 'Zoë Ångström' };
  model.plants[1]!.attributes = { Manager: '王芳' };
  model.plants.push({ code: '1001', name: '', country: '', row: 4,
    attributes: { 'Cost centre': '0042' } });
  model.suppliers[1]!.attributes = { Notes: 'line one\nline two, "quoted"' };
  model.products[0]!.weeklyRevenue = 1234.5678901234;
  model.products.push({ code: 'F3', plantCode: '1001', name: 'Ölpumpe – Größe 3',
    weeklyRevenue: 0.1 + 0.2, row: 4 });
  model.bom.push({ parentCode: 'F3', childCode: 'B', qtyPer: 1e-9, row: 5 });
  model.sourcing.push({ buyerCode: '1001', itemCode: 'B', supplierCode: 'S1', sharePct: 33.3,
    isQualified: true, row: 6 });
  return model;
}

describe('writeWorkbook', () => {
  it('reads back to the same small network', async () => {
    const model = smallNetworkModel();
    const result = await readWorkbook(await writeWorkbook(model));
    expect(result.errors).toEqual([]);
    expect(result.model).toStrictEqual(model);
  });

  it('round-trips attributes, numeric-looking codes, nulls and non-ASCII names', async () => {
    const model = richModel();
    expect(validateModel(model).errors).toEqual([]);
    const result = await readWorkbook(await writeWorkbook(model));
    expect(result.errors).toEqual([]);
    expect(result.model).toStrictEqual(model);
    expect(result.model?.suppliers.map((supplier) => supplier.name)).toEqual([
      'Müller Guss GmbH', '苏州精密', 'Raw Metals',
    ]);
  });

  it('writes text that looks like a formula as text, never as a formula', async () => {
    const model = smallNetworkModel();
    model.suppliers[0]!.name = '=HYPERLINK("http://example.invalid","open")';
    model.suppliers[1]!.name = '+1-555-0100';
    const workbook = await openWorkbook(await writeWorkbook(model));
    const sheet = workbook.getWorksheet('Suppliers')!;
    for (const row of [2, 3]) {
      const cell = sheet.getRow(row).getCell(2);
      expect(cell.type).toBe(ExcelJS.ValueType.String);
      expect(cell.formula).toBeUndefined();
    }
    const result = await readWorkbook(await writeWorkbook(model));
    expect(result.model?.suppliers[0]!.name).toBe('=HYPERLINK("http://example.invalid","open")');
  });

  it('writes the sheets in order, headers in row 1, attributes after them', async () => {
    const workbook = await openWorkbook(await writeWorkbook(richModel()));
    expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual([...SHEET_NAMES]);
    const plants = workbook.getWorksheet('Plants') as ExcelJS.Worksheet;
    expect(plants.getRow(1).values).toEqual([undefined, 'plant_code', 'plant_name', 'country',
      'Cost centre', 'Manager']);
    expect(plants.getCell('A4').value).toBe('1001');
    expect(plants.getCell('B4').value).toBeNull();
    const suppliers = workbook.getWorksheet('Suppliers') as ExcelJS.Worksheet;
    expect(suppliers.getCell('H2').value).toBe('yes');
    expect(suppliers.getCell('F3').value).toBeNull();
  });

  afterEach(() => {
    vi.useRealTimers();
  });

  it('gives byte-identical files for the same model written at different times', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date(Date.UTC(2025, 2, 3, 10, 0, 0)));
    const first = await writeWorkbook(richModel());
    vi.setSystemTime(new Date(Date.UTC(2026, 7, 9, 17, 31, 45)));
    const second = await writeWorkbook(richModel());
    expect(second).toEqual(first);
  });

  it('writes an empty model as header rows only', async () => {
    const empty: SupplyModel = { plants: [], products: [], bom: [], suppliers: [], sourcing: [],
      stock: [] };
    const workbook = await openWorkbook(await writeWorkbook(empty));
    for (const sheet of SHEET_NAMES) {
      expect(workbook.getWorksheet(sheet)?.actualRowCount).toBe(1);
    }
  });
});

describe('writeTemplate', () => {
  it('has a "Read me" sheet that documents every field of every sheet', async () => {
    const workbook = await openWorkbook(await writeTemplate());
    expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual(['Read me', ...SHEET_NAMES]);
    const readMe = workbook.getWorksheet('Read me') as ExcelJS.Worksheet;
    const documented = new Map<string, string[]>();
    readMe.eachRow((row) => {
      const [sheet, field, required, kind, blank, help] = (row.values as unknown[]).slice(1);
      if (typeof field === 'string' && field !== '' && field !== 'Column') {
        documented.set(`${sheet}.${field}`, [String(required), String(kind), String(blank),
          String(help)]);
      }
    });
    for (const sheet of SHEET_NAMES) {
      for (const field of TEMPLATE_FIELDS[sheet]) {
        const entry = documented.get(`${sheet}.${field.field}`);
        expect(entry, `${sheet}.${field.field}`).toBeDefined();
        expect(entry?.[0]).toBe(field.required ? 'yes' : 'no');
        expect(entry?.[3]).toBe(field.help);
      }
    }
    expect(documented.get('BOM.qty_per')?.[2]).toBe('1');
    expect(documented.get('Suppliers.recovery_weeks')?.[2]).toBe('8');
    expect(documented.get('Products.weekly_revenue')?.[2]).toBe('not allowed');
  });

  it('has empty template sheets whose headers the reader accepts', async () => {
    const template = await writeTemplate();
    const workbook = await openWorkbook(template);
    for (const sheet of SHEET_NAMES) {
      const row = workbook.getWorksheet(sheet)?.getRow(1).values as unknown[];
      expect(row.slice(1)).toEqual(TEMPLATE_FIELDS[sheet].map((field) => field.field));
    }
    const result = await readWorkbook(template);
    // Only the emptiness of Plants and Products is wrong with a blank template.
    expect(result.errors.map((error) => error.message)).toEqual([
      'the sheet Plants has no data rows below its headers',
      'the sheet Products has no data rows below its headers',
    ]);
  });
});
