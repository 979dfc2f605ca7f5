/**
 * Checking an uploaded file: inspect it (sheets, header rows), read it with the mapping, and
 * decide the batch's status. The type of file is told by content (the workbook library), never
 * by its name. The header signature identifies files with the same layout, so a saved mapping
 * can be offered again for next quarter's file.
 */
import { createHash } from 'node:crypto';
import {
  SHEET_NAMES,
  type ImportStatus,
  type SupplyModel,
  type WorkbookError,
  type WorkbookInspection,
  type WorkbookMapping,
  type WorkbookWarning,
} from '@keelson/contracts';
import { readWorkbook, type WorkbookLimits } from '@keelson/workbook';
import type { StoredProblem } from '@keelson/db';

/** What checking a file found. */
export interface FileCheck {
  status: Exclude<ImportStatus, 'committed'>;
  /** Told by content; null when the file could not be read as a spreadsheet at all. */
  format: 'xlsx' | 'csv' | 'zip' | null;
  sheets: { name: string; rowCount: number }[];
  counts: Record<string, number>;
  errors: WorkbookError[];
  warnings: WorkbookWarning[];
  /** SHA-256 of the sheet names and header rows; null when no sheet could be read. */
  headerSignature: string | null;
  /** The validated model; null unless the status is `ready`. */
  model: SupplyModel | null;
  inspection: WorkbookInspection;
}

/** Options of {@link checkFile}. */
export interface CheckFileOptions {
  fileName: string;
  mapping?: WorkbookMapping;
  limits?: Partial<WorkbookLimits>;
}

/**
 * Errors that a mapping can resolve: a required sheet or column not found under the template's
 * name, or a mapping that points at something the file does not have. Matched on the reader's
 * wording (libs/workbook/src/sheet-layout.ts); the specs pin each case.
 */
const LAYOUT_MESSAGES: readonly RegExp[] = [
  /^the sheet \S+ is missing$/,
  /^the sheet ".*" chosen for \S+ is not in the file$/,
  /^the file holds none of the template's sheets/,
  /^the required column \S+ is missing/,
  /^the header ".*" chosen for \S+ is not in row \d+$/,
  /^the sheet has no headers in row \d+$/,
  /^the mapping names ".*", which is not a column of \S+$/,
  /^two headers map to /,
];

/** True for an error that the mapping step resolves (see {@link LAYOUT_MESSAGES}). */
export function isLayoutError(error: WorkbookError): boolean {
  return LAYOUT_MESSAGES.some((pattern) => pattern.test(error.message));
}

/** Inspects and reads `data`, and decides the status. Never throws for bad input. */
export async function checkFile(data: Uint8Array, options: CheckFileOptions): Promise<FileCheck> {
  const readOptions = { fileName: options.fileName, limits: options.limits,
    mapping: options.mapping };
  // One parse gives both the model and the mapping step's view of the file.
  const read = await readWorkbook(data, { ...readOptions, inspect: true });
  const inspection = read.inspection!;
  const sheets = inspection.sheets.map((sheet) => ({ name: sheet.name, rowCount: sheet.rowCount }));
  const format = inspection.sheets.length > 0 ? inspection.format : null;
  const headerSignature = inspection.sheets.length > 0 ? signatureOf(inspection) : null;
  if (inspection.errors.length > 0) {
    // The file itself could not be read (not a spreadsheet, too large, a zip bomb ...).
    return { status: 'rejected', format, sheets, counts: {}, errors: inspection.errors,
      warnings: [], headerSignature, model: null, inspection };
  }
  if (sheets.every((sheet) => sheet.rowCount === 0)) {
    const error: WorkbookError = { sheet: null, row: null, column: null, value: null,
      message: sheets.length === 0
        ? 'the workbook is empty: it has no sheets'
        : `the workbook is empty: no cell of ${sheetList(sheets)} holds a value` };
    return { status: 'rejected', format, sheets, counts: {}, errors: [error], warnings: [],
      headerSignature, model: null, inspection };
  }
  const needsMapping = inspection.missingSheets.length > 0 || read.errors.some(isLayoutError);
  const status = read.errors.length === 0 ? 'ready' : needsMapping ? 'needs_mapping' : 'rejected';
  return {
    status,
    format,
    sheets,
    counts: countsOf(read.counts),
    errors: read.errors,
    warnings: read.warnings,
    headerSignature,
    model: read.model,
    inspection,
  };
}

/** SHA-256 (hex) of the file's sheet names and header rows, in file order. */
export function signatureOf(inspection: WorkbookInspection): string {
  const layout = inspection.sheets.map((sheet) => [sheet.name, sheet.headers]);
  return createHash('sha256').update(JSON.stringify(layout)).digest('hex');
}

/** SHA-256 (hex) of bytes. */
export function sha256Of(data: Uint8Array): string {
  return createHash('sha256').update(data).digest('hex');
}

/** Errors as stored with a batch. */
export function storedErrors(errors: readonly WorkbookError[]): StoredProblem[] {
  return errors.map((error) => ({ ...error }));
}

/** Warnings as stored with a batch (the warning kind kept in `kind`). */
export function storedWarnings(warnings: readonly WorkbookWarning[]): StoredProblem[] {
  return warnings.map((warning) => ({ sheet: warning.sheet, row: warning.row, column: null,
    value: null, message: warning.message, kind: warning.kind }));
}

/** Stored warnings back as the reader's warnings. */
export function warningsOf(stored: readonly StoredProblem[]): WorkbookWarning[] {
  return stored.map((warning) => ({
    sheet: warning.sheet ?? '',
    row: warning.row,
    kind: (warning.kind ?? 'unsourced') as WorkbookWarning['kind'],
    message: warning.message,
  }));
}

/** Stored errors back as the reader's errors. */
export function errorsOf(stored: readonly StoredProblem[]): WorkbookError[] {
  return stored.map(({ kind: _kind, ...error }) => {
    void _kind;
    return error;
  });
}

function countsOf(counts: Partial<Record<string, number>>): Record<string, number> {
  const result: Record<string, number> = {};
  for (const sheet of SHEET_NAMES) {
    const value = counts[sheet];
    if (value !== undefined) {
      result[sheet] = value;
    }
  }
  return result;
}

function sheetList(sheets: readonly { name: string }[]): string {
  const names = sheets.slice(0, 5).map((sheet) => `"${sheet.name}"`).join(', ');
  return sheets.length > 5 ? `${names} and ${sheets.length - 5} more` : names;
}

/** The last path part of an uploaded name, without control characters, at most 200 long. */
export function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const base = (name.split(/[\\/]/u).pop() ?? '').replace(/[\u0000-\u001f\u007f]/gu, '').trim();
  return base.slice(-200) || 'upload';
}
