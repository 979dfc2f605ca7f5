/**
 * The error report: the buyer's own workbook with every problem cell highlighted (red fill for
 * errors, amber for warnings, a note with the message) and a "Problems" sheet listing them all.
 * For CSV or zip input the report is a workbook of the parsed sheets, highlighted the same way.
 */
import type { WorkbookError, WorkbookWarning } from '@keelson/contracts';
import ExcelJS from 'exceljs';
import { loadSource } from './file-source';
import { resolveLimits, type WorkbookLimits } from './limits';
import { isFault, type RawSheet } from './raw-sheet';
import { toBytes } from './write-workbook';

/** Options of {@link writeErrorReport}. */
export interface ErrorReportOptions {
  /** The upload's file name; names the sheet of a single CSV file. */
  fileName?: string;
  limits?: Partial<WorkbookLimits>;
}

/** Fill of cells with an error (light red). */
export const ERROR_FILL_ARGB = 'FFFFC7CE';
/** Fill of cells with a warning (amber). */
export const WARNING_FILL_ARGB = 'FFFFEB9C';

const MAX_SHEET_NAME = 31;

/**
 * Writes the report for an upload: the buyer's workbook (xlsx input) or the parsed sheets
 * (CSV or zip input) with problem cells filled red (errors) or amber (warnings), each with a
 * note holding its messages, and a "Problems" sheet listing every problem.
 */
export async function writeErrorReport(
  data: Uint8Array,
  errors: readonly WorkbookError[],
  warnings: readonly WorkbookWarning[],
  options: ErrorReportOptions = {},
): Promise<Uint8Array> {
  const source = await loadSource(data, resolveLimits(options.limits), options.fileName);
  const workbook = source.workbook ?? workbookOf(source.sheets);
  const notes = new Map<string, { worksheet: ExcelJS.Worksheet; cell: string; lines: string[];
    isError: boolean }>();
  const mark = (sheet: string | null, cell: string | undefined, message: string,
    isError: boolean) => {
    const worksheet = sheet === null ? undefined : workbook.getWorksheet(sheet);
    if (worksheet === undefined || cell === undefined) {
      return;
    }
    const key = `${worksheet.id}!${cell}`;
    const note = notes.get(key) ?? { worksheet, cell, lines: [], isError: false };
    note.lines.push(message);
    note.isError ||= isError;
    notes.set(key, note);
  };
  for (const error of errors) {
    const cell = error.cell ?? (error.row === null ? undefined : `A${error.row}`);
    mark(error.sheet, cell, error.message, true);
  }
  for (const warning of warnings) {
    mark(warning.sheet, warning.row === null ? undefined : `A${warning.row}`, warning.message,
      false);
  }
  for (const { worksheet, cell, lines, isError } of notes.values()) {
    const target = worksheet.getCell(cell);
    target.fill = { type: 'pattern', pattern: 'solid',
      fgColor: { argb: isError ? ERROR_FILL_ARGB : WARNING_FILL_ARGB } };
    target.note = lines.join('\n');
  }
  addProblemsSheet(workbook, errors, warnings);
  return toBytes(workbook);
}

function workbookOf(sheets: readonly RawSheet[]): ExcelJS.Workbook {
  const workbook = new ExcelJS.Workbook();
  for (const sheet of sheets) {
    const worksheet = workbook.addWorksheet(uniqueName(workbook, sheet.name));
    for (const row of sheet.rows) {
      const target = worksheet.getRow(row.row);
      row.cells.forEach((value, index) => {
        if (value !== null) {
          target.getCell(index + 1).value = isFault(value) ? value.fault : value;
        }
      });
    }
  }
  return workbook;
}

function addProblemsSheet(
  workbook: ExcelJS.Workbook,
  errors: readonly WorkbookError[],
  warnings: readonly WorkbookWarning[],
): void {
  const worksheet = workbook.addWorksheet(uniqueName(workbook, 'Problems'));
  worksheet.columns = [
    { header: 'Severity', width: 10 },
    { header: 'Sheet', width: 14 },
    { header: 'Row', width: 7 },
    { header: 'Cell', width: 7 },
    { header: 'Column', width: 20 },
    { header: 'Value', width: 18 },
    { header: 'Message', width: 100 },
  ];
  worksheet.getRow(1).font = { bold: true };
  for (const error of errors) {
    const row = worksheet.addRow(['error', error.sheet, error.row, error.cell ?? null,
      error.column, error.value, error.message]);
    row.getCell(1).fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: ERROR_FILL_ARGB } };
  }
  for (const warning of warnings) {
    const row = worksheet.addRow(['warning', warning.sheet, warning.row, null, warning.kind,
      null, warning.message]);
    row.getCell(1).fill = { type: 'pattern', pattern: 'solid',
      fgColor: { argb: WARNING_FILL_ARGB } };
  }
  workbook.views = [{ activeTab: workbook.worksheets.length - 1 } as ExcelJS.WorkbookView];
}

/** A sheet name not yet used in the workbook, within Excel's 31 characters. */
function uniqueName(workbook: ExcelJS.Workbook, wanted: string): string {
  const base = wanted.replace(/[\\/?*[\]:]/gu, ' ').slice(0, MAX_SHEET_NAME) || 'Sheet';
  let name = base;
  for (let suffix = 2; workbook.getWorksheet(name) !== undefined; suffix += 1) {
    name = `${base.slice(0, MAX_SHEET_NAME - String(suffix).length - 3)} (${suffix})`;
  }
  return name;
}
