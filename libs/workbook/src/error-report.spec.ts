/**
 * The error report: problem cells of the buyer's own workbook filled and annotated, and a
 * Problems sheet; for CSV input, a workbook of the parsed sheets marked the same way. The report
 * is opened with exceljs to check what a spreadsheet program shows.
 */
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { ERROR_FILL_ARGB, WARNING_FILL_ARGB, writeErrorReport } from './error-report';
import { buildXlsx, smallNetworkSheets, toCsv, utf8, buildZip } from './fixture-workbooks';
import { readWorkbook } from './read-workbook';

async function openWorkbook(bytes: Uint8Array): Promise<ExcelJS.Workbook> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
    bytes.byteOffset + bytes.byteLength) as ArrayBuffer as never);
  return workbook;
}

function fillOf(cell: ExcelJS.Cell): string | undefined {
  const fill = cell.fill as ExcelJS.FillPattern | undefined;
  return fill?.fgColor?.argb;
}

function noteOf(cell: ExcelJS.Cell): string {
  const note = cell.note as string | ExcelJS.Comment | undefined;
  if (typeof note === 'string' || note === undefined) {
    return note ?? '';
  }
  return (note.texts ?? []).map((run) => run.text).join('');
}

/** The small network with a bad number, an unknown plant and a product without BOM. */
function faultySheets() {
  const sheets = smallNetworkSheets();
  sheets['Products'] = [
    ['product_code', 'plant_code', 'product_name', 'weekly_revenue', 'Owner'],
    ['F1', 'P1', 'Pump housing', '12,00', 'Ana'],
    ['F2', 'P9', 'Valve', 2500, 'Ben'],
    ['F3', 'P1', 'Spare', 10, 'Cy'],
  ];
  return sheets;
}

describe('writeErrorReport', () => {
  it('highlights the problem cells of the buyer workbook and lists them', async () => {
    const xlsx = await buildXlsx({ Cover: [['Prepared by purchasing']], ...faultySheets() });
    const read = await readWorkbook(xlsx);
    expect(read.errors.map((error) => error.cell)).toEqual(['D2', 'B3']);
    expect(read.warnings.map((warning) => [warning.sheet, warning.row])).toEqual([['Products', 4]]);
    const report = await openWorkbook(await writeErrorReport(xlsx, read.errors, read.warnings));
    expect(report.worksheets.map((sheet) => sheet.name)).toEqual([
      'Cover', 'Plants', 'Products', 'BOM', 'Suppliers', 'Sourcing', 'Stock', 'Problems',
    ]);
    const products = report.getWorksheet('Products') as ExcelJS.Worksheet;
    expect(fillOf(products.getCell('D2'))).toBe(ERROR_FILL_ARGB);
    expect(noteOf(products.getCell('D2')))
      .toContain('weekly_revenue: expected a number; got "12,00"');
    expect(fillOf(products.getCell('B3'))).toBe(ERROR_FILL_ARGB);
    expect(noteOf(products.getCell('B3')))
      .toBe('plant_code "P9" is not a plant of the Plants sheet');
    expect(fillOf(products.getCell('A4'))).toBe(WARNING_FILL_ARGB);
    expect(fillOf(products.getCell('C2'))).toBeUndefined();
    // The buyer's own content is kept.
    expect(products.getCell('E3').value).toBe('Ben');
    expect(report.getWorksheet('Cover')?.getCell('A1').value).toBe('Prepared by purchasing');
    const problems = report.getWorksheet('Problems') as ExcelJS.Worksheet;
    const listed = [];
    for (let row = 2; row <= problems.actualRowCount; row += 1) {
      const values = problems.getRow(row).values as unknown[];
      listed.push(values.slice(1, 5));
    }
    expect(listed).toEqual([
      ['error', 'Products', 2, 'D2'],
      ['error', 'Products', 3, 'B3'],
      ['warning', 'Products', 4, undefined],
    ]);
  });

  it('writes the parsed sheets of CSV input, highlighted the same way', async () => {
    const files: Record<string, Uint8Array> = {};
    for (const [name, rows] of Object.entries(faultySheets())) {
      files[`${name}.csv`] = utf8(toCsv(rows));
    }
    const zip = buildZip(files);
    const read = await readWorkbook(zip);
    expect(read.format).toBe('zip');
    const report = await openWorkbook(await writeErrorReport(zip, read.errors, read.warnings));
    const products = report.getWorksheet('Products') as ExcelJS.Worksheet;
    expect(products.getCell('D2').value).toBe('12,00');
    expect(fillOf(products.getCell('D2'))).toBe(ERROR_FILL_ARGB);
    expect(report.getWorksheet('Problems')?.actualRowCount).toBe(4);
  });

  it('still writes a Problems sheet when the upload is not a spreadsheet', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const read = await readWorkbook(png);
    const report = await openWorkbook(await writeErrorReport(png, read.errors, read.warnings));
    expect(report.worksheets.map((sheet) => sheet.name)).toEqual(['Problems']);
    expect(report.getWorksheet('Problems')?.getCell('G2').value)
      .toBe('not a spreadsheet: the file is a PNG image');
  });
});
