/**
 * Turns uploaded bytes into raw sheets. The format is told by content, never by file name: the
 * zip signature means an xlsx workbook or a zip of CSV files, other text means one CSV file,
 * anything else is refused as "not a spreadsheet". Size limits come first, then the zip
 * directory and a capped inflate, and only then a parser; every failure is an error, not a throw.
 */
import type { WorkbookError } from '@keelson/contracts';
import type ExcelJS from 'exceljs';
import { decodeText, isLikelyText, parseCsv, sheetNameOfFile } from './csv-source';
import { formatBytes, type WorkbookLimits } from './limits';
import { fileError } from './problems';
import type { RawSheet } from './raw-sheet';
import { loadXlsx, rowLimitMessage, vetXlsxArchive, worksheetsToRawSheets } from './xlsx-source';
import { readZipDirectory, type ZipEntry } from './zip-directory';
import { inflateEntry } from './zip-inflate';

/** The format of an input, told by its content. */
export type InputFormat = 'xlsx' | 'csv' | 'zip';

/** What a file held: its sheets in file order, or the errors that stopped reading it. */
export interface LoadedSource {
  format: InputFormat;
  sheets: RawSheet[];
  errors: WorkbookError[];
  /** The exceljs workbook of an xlsx input (the error report writes into it). */
  workbook?: ExcelJS.Workbook;
}

/** A named CSV file. */
export interface CsvFile {
  name: string;
  data: Uint8Array;
}

const SIGNATURES: { bytes: number[]; what: string }[] = [
  { bytes: [0x89, 0x50, 0x4e, 0x47], what: 'a PNG image' },
  { bytes: [0xff, 0xd8, 0xff], what: 'a JPEG image' },
  { bytes: [0x47, 0x49, 0x46, 0x38], what: 'a GIF image' },
  { bytes: [0x25, 0x50, 0x44, 0x46], what: 'a PDF document' },
  { bytes: [0x1f, 0x8b], what: 'a gzip archive' },
  { bytes: [0x52, 0x61, 0x72, 0x21], what: 'a RAR archive' },
  { bytes: [0x37, 0x7a, 0xbc, 0xaf], what: 'a 7-Zip archive' },
  {
    bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1],
    what: 'an old-format Excel (.xls) file or a password-protected workbook; save it as .xlsx '
      + 'without a password',
  },
];

/** Reads one uploaded file (xlsx, zip of CSV files, or one CSV file). */
export async function loadSource(
  data: Uint8Array,
  limits: WorkbookLimits,
  fileName: string | undefined,
): Promise<LoadedSource> {
  const isZip = data[0] === 0x50 && data[1] === 0x4b &&
    ((data[2] === 0x03 && data[3] === 0x04) || (data[2] === 0x05 && data[3] === 0x06));
  const fail = (format: InputFormat, message: string): LoadedSource =>
    ({ format, sheets: [], errors: [fileError(message)] });
  if (data.length > limits.maxBytes) {
    return fail(isZip ? 'xlsx' : 'csv', sizeMessage(data.length, limits.maxBytes));
  }
  if (data.length === 0) {
    return fail('csv', 'the file is empty');
  }
  if (isZip) {
    return loadArchive(data, limits);
  }
  const known = SIGNATURES.find(({ bytes }) => bytes.every((byte, index) => data[index] === byte));
  if (known !== undefined) {
    return fail('csv', `not a spreadsheet: the file is ${known.what}`);
  }
  if (!isLikelyText(data)) {
    return fail('csv', 'not a spreadsheet: the file is neither an .xlsx workbook nor CSV text');
  }
  const name = sheetNameOfFile(fileName ?? 'Sheet1.csv');
  return loadCsvList([{ name, data }], limits, 'csv');
}

/** Reads CSV files given one by one (one sheet each). */
export function loadCsvFiles(files: readonly CsvFile[], limits: WorkbookLimits): LoadedSource {
  const total = files.reduce((sum, file) => sum + file.data.length, 0);
  if (total > limits.maxBytes) {
    return { format: 'csv', sheets: [], errors: [fileError(sizeMessage(total, limits.maxBytes))] };
  }
  return loadCsvList(files.map((file) => ({ ...file, name: sheetNameOfFile(file.name) })), limits,
    'csv');
}

async function loadArchive(data: Uint8Array, limits: WorkbookLimits): Promise<LoadedSource> {
  const directory = readZipDirectory(data, limits);
  if ('error' in directory) {
    return { format: 'xlsx', sheets: [], errors: [fileError(directory.error)] };
  }
  const files = directory.entries.filter((entry) => !entry.name.endsWith('/'));
  const isWorkbook = files.some((entry) => entry.name === 'xl/workbook.xml') ||
    files.some((entry) => entry.name === '[Content_Types].xml');
  if (isWorkbook) {
    const refusal = vetXlsxArchive(data, files, limits);
    if (refusal !== null) {
      return { format: 'xlsx', sheets: [], errors: [fileError(refusal)] };
    }
    const workbook = await loadXlsx(data);
    if (typeof workbook === 'string') {
      return { format: 'xlsx', sheets: [], errors: [fileError(workbook)] };
    }
    const outcome = worksheetsToRawSheets(workbook, limits);
    if ('error' in outcome) {
      return { format: 'xlsx', sheets: [], errors: [fileError(outcome.error)] };
    }
    return { format: 'xlsx', sheets: outcome.sheets, errors: [], workbook };
  }
  const csvEntries = files.filter(isCsvEntry);
  if (csvEntries.length === 0) {
    const message = files.length === 0
      ? 'the zip archive is empty'
      : 'the zip archive holds neither an .xlsx workbook nor .csv files';
    return { format: 'zip', sheets: [], errors: [fileError(message)] };
  }
  return loadCsvEntries(data, csvEntries, limits);
}

function loadCsvEntries(
  archive: Uint8Array,
  entries: readonly ZipEntry[],
  limits: WorkbookLimits,
): LoadedSource {
  const files: CsvFile[] = [];
  for (const entry of entries) {
    const outcome = inflateEntry(archive, entry, { isCollected: true });
    if ('error' in outcome) {
      return { format: 'zip', sheets: [], errors: [fileError(outcome.error)] };
    }
    files.push({ name: sheetNameOfFile(entry.name), data: outcome.bytes ?? new Uint8Array(0) });
  }
  return loadCsvList(files, limits, 'zip');
}

function loadCsvList(
  files: readonly CsvFile[],
  limits: WorkbookLimits,
  format: InputFormat,
): LoadedSource {
  const sheets: RawSheet[] = [];
  const errors: WorkbookError[] = [];
  let budget = limits.maxRows;
  for (const file of files) {
    if (!isLikelyText(file.data)) {
      errors.push({ ...fileError(`not a spreadsheet: "${file.name}" is not CSV text`),
        sheet: file.name });
      continue;
    }
    const outcome = parseCsv(decodeText(file.data), budget);
    if ('overLimit' in outcome) {
      return { format, sheets: [], errors: [fileError(rowLimitMessage(limits.maxRows))] };
    }
    if (outcome.problem !== undefined) {
      errors.push({ sheet: file.name, row: outcome.problem.row, column: null, value: null,
        message: outcome.problem.message });
    }
    budget -= outcome.rows.length;
    sheets.push({ name: file.name, rows: outcome.rows });
  }
  return { format, sheets, errors };
}

function isCsvEntry(entry: ZipEntry): boolean {
  const base = entry.name.split('/').pop() ?? '';
  return /\.csv$/iu.test(base) && !base.startsWith('.') && !entry.name.startsWith('__MACOSX/');
}

function sizeMessage(size: number, limit: number): string {
  return `the file is ${size} bytes (${formatBytes(size)}); the limit is ${limit} bytes ` +
    `(${formatBytes(limit)})`;
}
