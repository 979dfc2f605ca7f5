/**
 * Writes supply models to template workbooks, and the empty template itself. A written model
 * reads back to the same model: rows in model order from row 2, attributes as extra columns
 * after the template's, blank cells for null optional values, yes/no as "yes"/"no".
 */
import { SHEET_NAMES, type SheetName, type SupplyModel } from '@keelson/contracts';
import ExcelJS from 'exceljs';
import { recordsBySheet } from './model-checks';
import { TEMPLATE_FIELDS, type TemplateField } from './template-fields';
import { writeReadMe } from './template-read-me';
import { withFixedTimestamps } from './zip-timestamps';

const HEADER_FILL: ExcelJS.Fill = {
  type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFDCE6F1' },
};
const REQUIRED_FILL: ExcelJS.Fill = {
  type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFB8CCE4' },
};

/** Writes a model in the template's format (.xlsx bytes); the same model gives the same bytes. */
export async function writeWorkbook(model: SupplyModel): Promise<Uint8Array> {
  const workbook = newWorkbook();
  const records = new Map(recordsBySheet(model));
  for (const sheet of SHEET_NAMES) {
    const rows = records.get(sheet) ?? [];
    const extraHeaders = attributeHeaders(rows);
    const worksheet = addTemplateSheet(workbook, sheet, extraHeaders);
    for (const record of rows) {
      const values: ExcelJS.CellValue[] = TEMPLATE_FIELDS[sheet].map((field) =>
        cellValueOf(field, record[field.property]));
      const attributes = (record['attributes'] ?? {}) as Record<string, string>;
      for (const header of extraHeaders) {
        values.push(attributes[header] ?? null);
      }
      worksheet.addRow(values);
    }
  }
  return toBytes(workbook);
}

/** The empty template: a "Read me" sheet explaining every column, then the six sheets. */
export async function writeTemplate(): Promise<Uint8Array> {
  const workbook = newWorkbook();
  writeReadMe(workbook.addWorksheet('Read me'));
  for (const sheet of SHEET_NAMES) {
    addTemplateSheet(workbook, sheet, []);
  }
  return toBytes(workbook);
}

/** A workbook's bytes as a Uint8Array. */
export async function toBytes(workbook: ExcelJS.Workbook): Promise<Uint8Array> {
  const buffer = await workbook.xlsx.writeBuffer();
  return withFixedTimestamps(new Uint8Array(buffer as ArrayBuffer));
}

function newWorkbook(): ExcelJS.Workbook {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Keelson';
  // A fixed date keeps the written file the same for the same model.
  workbook.created = new Date(Date.UTC(2024, 0, 1));
  workbook.modified = workbook.created;
  return workbook;
}

function addTemplateSheet(
  workbook: ExcelJS.Workbook,
  sheet: SheetName,
  extraHeaders: readonly string[],
): ExcelJS.Worksheet {
  const worksheet = workbook.addWorksheet(sheet, { views: [{ state: 'frozen', ySplit: 1 }] });
  const fields = TEMPLATE_FIELDS[sheet];
  worksheet.columns = [
    ...fields.map((field) => ({ header: field.field, width: Math.max(14, field.field.length + 4),
    })),
    ...extraHeaders.map((header) => ({ header, width: Math.max(12, header.length + 4) })),
  ];
  const header = worksheet.getRow(1);
  header.font = { bold: true };
  fields.forEach((field, index) => {
    const cell = header.getCell(index + 1);
    cell.fill = field.required ? REQUIRED_FILL : HEADER_FILL;
    cell.note = `${field.required ? 'Required. ' : ''}${field.help}`;
  });
  return worksheet;
}

/** The attribute headers of a sheet's records, in order of first appearance. */
function attributeHeaders(records: readonly Record<string, unknown>[]): string[] {
  const headers: string[] = [];
  for (const record of records) {
    for (const header of Object.keys((record['attributes'] ?? {}) as object)) {
      if (!headers.includes(header)) {
        headers.push(header);
      }
    }
  }
  return headers;
}

function cellValueOf(field: TemplateField, value: unknown): ExcelJS.CellValue {
  if (value === null || value === undefined || value === '') {
    return null;
  }
  if (field.kind === 'yesno') {
    return value === true ? 'yes' : 'no';
  }
  return value as ExcelJS.CellValue;
}
