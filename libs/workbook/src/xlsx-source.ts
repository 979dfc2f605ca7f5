/**
 * Reads an xlsx archive into raw sheets. The archive is vetted first (directory limits, a capped
 * inflate of every entry, a count of worksheet rows) and only then handed to exceljs, inside a
 * try/catch, so a crafted file becomes an error. Cells are unwrapped here: formulas give their
 * saved result, rich text and hyperlinks give their text, error values become faults.
 */
import ExcelJS from 'exceljs';
import type { WorkbookLimits } from './limits';
import type { CellFault, RawRow, RawSheet, RawValue } from './raw-sheet';
import { RowTagCounter } from './row-tag-counter';
import { inflateEntry } from './zip-inflate';
import type { ZipEntry } from './zip-directory';

/** Raw sheets in workbook order, or the reason the file was refused. */
export type SheetsOutcome = { sheets: RawSheet[] } | { error: string };

const WORKSHEET_ENTRY = /^xl\/worksheets\/[^/]+\.xml$/iu;

/** The message for a file whose rows pass the limit. */
export function rowLimitMessage(limit: number): string {
  return `the file has more than ${limit} rows; the limit is ${limit}`;
}

/** Checks every entry's real size and the worksheet row count before any parsing. */
export function vetXlsxArchive(
  archive: Uint8Array,
  entries: readonly ZipEntry[],
  limits: WorkbookLimits,
): string | null {
  const rows = new RowTagCounter();
  for (const entry of entries) {
    if (entry.name.endsWith('/')) {
      continue;
    }
    const isWorksheet = WORKSHEET_ENTRY.test(entry.name);
    const outcome = inflateEntry(archive, entry, {
      isCollected: false,
      onChunk: isWorksheet ? (chunk) => rows.push(chunk) : undefined,
    });
    if ('error' in outcome) {
      return outcome.error;
    }
    rows.finish();
    if (rows.count > limits.maxRows) {
      return rowLimitMessage(limits.maxRows);
    }
  }
  return null;
}

/** Loads a vetted archive with exceljs; never throws. */
export async function loadXlsx(archive: Uint8Array): Promise<ExcelJS.Workbook | string> {
  const workbook = new ExcelJS.Workbook();
  try {
    const bytes = archive.buffer.slice(
      archive.byteOffset,
      archive.byteOffset + archive.byteLength,
    ) as ArrayBuffer;
    await workbook.xlsx.load(bytes as unknown as Parameters<typeof workbook.xlsx.load>[0]);
    return workbook;
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return `the workbook cannot be read (${detail.slice(0, 200)}); save it again as .xlsx`;
  }
}

/** The worksheets of a loaded workbook as raw sheets, stopping at the row limit. */
export function worksheetsToRawSheets(
  workbook: ExcelJS.Workbook,
  limits: WorkbookLimits,
): SheetsOutcome {
  const sheets: RawSheet[] = [];
  let rowCount = 0;
  for (const worksheet of workbook.worksheets) {
    const rows: RawRow[] = [];
    let isOverLimit = false;
    worksheet.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      rowCount += 1;
      if (rowCount > limits.maxRows) {
        isOverLimit = true;
        return;
      }
      const cells: RawValue[] = [];
      row.eachCell({ includeEmpty: false }, (cell, column) => {
        cells[column - 1] = unwrapCell(cell.value);
      });
      for (let column = 0; column < cells.length; column += 1) {
        cells[column] ??= null;
      }
      rows.push({ row: rowNumber, cells });
    });
    if (isOverLimit) {
      return { error: rowLimitMessage(limits.maxRows) };
    }
    sheets.push({ name: worksheet.name, rows });
  }
  return { sheets };
}

/** An exceljs cell value unwrapped to a plain value or a fault. */
export function unwrapCell(value: ExcelJS.CellValue): RawValue {
  if (value === null || value === undefined) {
    return null;
  }
  if (typeof value !== 'object' || value instanceof Date) {
    return value;
  }
  if ('error' in value) {
    return fault(value.error);
  }
  if ('richText' in value) {
    return richTextOf(value);
  }
  if ('formula' in value || 'sharedFormula' in value) {
    const result = (value as ExcelJS.CellFormulaValue).result;
    if (result === undefined || result === null) {
      return fault('formula without a saved result (open and save the file in Excel)');
    }
    return unwrapCell(result as ExcelJS.CellValue);
  }
  if ('hyperlink' in value) {
    const text: unknown = value.text;
    if (typeof text === 'string') {
      return text;
    }
    if (typeof text === 'object' && text !== null && 'richText' in text) {
      return richTextOf(text as ExcelJS.CellRichTextValue);
    }
    return value.hyperlink;
  }
  return fault('a cell value of an unknown kind');
}


function richTextOf(value: ExcelJS.CellRichTextValue): string {
  return (value.richText ?? []).map((run) => run.text ?? '').join('');
}

function fault(text: string): CellFault {
  return { fault: text };
}
