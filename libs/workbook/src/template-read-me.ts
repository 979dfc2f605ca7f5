/**
 * The template's "Read me" sheet: what each sheet holds and, for every column, whether it is
 * required, what it accepts and what a blank cell means. It is written from TEMPLATE_FIELDS, so
 * it cannot drift from what the reader accepts.
 */
import { SHEET_NAMES } from '@keelson/contracts';
import type ExcelJS from 'exceljs';
import { DEFAULT_WORKBOOK_LIMITS, formatBytes } from './limits';
import {
  REQUIRED_SHEETS,
  SHEET_HELP,
  TEMPLATE_FIELDS,
  type TemplateField,
} from './template-fields';

const KIND_TEXT: Record<TemplateField['kind'], string> = {
  code: 'code (text; a whole number such as 1001 is read as "1001")',
  text: 'text',
  number: 'number ("1,200" and "12.5" are fine; no currency signs, "%" or spaces)',
  yesno: 'yes/no (yes, no, y, n, true, false, 1, 0)',
};

const GENERAL_RULES = [
  'Headers go in row 1. Header and sheet names may use any case, spaces or underscores '
    + '("Supplier Code" = supplier_code). Extra columns are kept but not analysed.',
  `Required sheets: ${REQUIRED_SHEETS.join(', ')}. Stock is optional. Other sheets are ignored.`,
  'Codes are case-sensitive and must be unique in their sheet; a code names one kind only '
    + '(a plant, a product, an item or a supplier).',
  'An item with BOM children is made; a plant may not also buy it in Sourcing.',
  'The BOM must not loop (A needs B, B needs A).',
  'Any error rejects the whole file; every error is listed with its sheet, row and column.',
  `Limits: ${formatBytes(DEFAULT_WORKBOOK_LIMITS.maxBytes)} per file, `
    + `${DEFAULT_WORKBOOK_LIMITS.maxRows.toLocaleString('en-US')} rows over all sheets.`,
];

/** Fills a worksheet with the template's explanations. */
export function writeReadMe(worksheet: ExcelJS.Worksheet): void {
  worksheet.columns = [
    { header: 'Sheet', width: 12 },
    { header: 'Column', width: 22 },
    { header: 'Required', width: 10 },
    { header: 'Kind', width: 44 },
    { header: 'Blank means', width: 16 },
    { header: 'Meaning', width: 90 },
  ];
  worksheet.getRow(1).font = { bold: true };
  for (const sheet of SHEET_NAMES) {
    const intro = worksheet.addRow([sheet, '', '', '', '', SHEET_HELP[sheet]]);
    intro.font = { bold: true };
    for (const field of TEMPLATE_FIELDS[sheet]) {
      worksheet.addRow([sheet, field.field, field.required ? 'yes' : 'no', KIND_TEXT[field.kind],
        blankMeaning(field), field.help]);
    }
  }
  worksheet.addRow([]);
  worksheet.addRow(['Rules']).font = { bold: true };
  for (const rule of GENERAL_RULES) {
    worksheet.addRow(['', '', '', '', '', rule]);
  }
}

function blankMeaning(field: TemplateField): string {
  if (field.default !== undefined) {
    if (typeof field.default === 'boolean') {
      return field.default ? 'yes' : 'no';
    }
    return String(field.default);
  }
  if (field.required) {
    return 'not allowed';
  }
  return field.kind === 'text' ? 'empty' : 'not known';
}
