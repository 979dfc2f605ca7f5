/**
 * Reads CSV text into a raw sheet (RFC 4180: comma-separated, double quotes around fields that
 * hold commas, quotes or line breaks, a quote inside written twice; CRLF or LF line ends). Only
 * the comma separates: a semicolon is ordinary text, so a file written with ";" separators reads
 * as one column and its headers will not match. Row numbers are record numbers, as a
 * spreadsheet program shows them when it opens the file.
 */
import type { RawRow } from './raw-sheet';

/** Rows of one CSV file, and the problem that made part of it unreadable, if any. */
export interface CsvOutcome {
  rows: RawRow[];
  problem?: { message: string; row: number };
}

const UNCLOSED_QUOTE = 'a quoted field is never closed (a " is missing)';

/** Whether the bytes look like text (no NUL or other control bytes besides tab and line ends). */
export function isLikelyText(bytes: Uint8Array): boolean {
  if (hasUtf16Mark(bytes)) {
    return true;
  }
  const sample = bytes.subarray(0, 64 * 1024);
  for (const byte of sample) {
    if ((byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d) || byte === 0x7f) {
      return false;
    }
  }
  return true;
}

/** Decodes text: UTF-8 (with or without its mark), UTF-16 with a mark, else Windows-1252. */
export function decodeText(bytes: Uint8Array): string {
  if (bytes[0] === 0xff && bytes[1] === 0xfe) {
    return new TextDecoder('utf-16le').decode(bytes.subarray(2));
  }
  if (bytes[0] === 0xfe && bytes[1] === 0xff) {
    return new TextDecoder('utf-16be').decode(bytes.subarray(2));
  }
  const hasMark = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf;
  const body = hasMark ? bytes.subarray(3) : bytes;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(body);
  } catch {
    // Spreadsheet programs on Windows often save CSV in the ANSI code page.
    return new TextDecoder('windows-1252').decode(body);
  }
}

/** Parses CSV text into rows; stops with an error once more than `maxRows` records are read. */
export function parseCsv(text: string, maxRows: number): CsvOutcome | { overLimit: true } {
  const rows: RawRow[] = [];
  let fields: string[] = [];
  let field = '';
  let isQuoted = false;
  let quoteRow = 0;
  let hasContent = false;
  const endRecord = (): boolean => {
    fields.push(field);
    rows.push({ row: rows.length + 1, cells: fields.map((cell) => (cell === '' ? null : cell)) });
    fields = [];
    field = '';
    hasContent = false;
    return rows.length > maxRows;
  };
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  for (let at = 0; at < source.length; at += 1) {
    const char = source[at] as string;
    if (isQuoted) {
      if (char !== '"') {
        field += char;
      } else if (source[at + 1] === '"') {
        field += '"';
        at += 1;
      } else {
        isQuoted = false;
      }
      continue;
    }
    if (char === '"' && field === '') {
      isQuoted = true;
      quoteRow = rows.length + 1;
      hasContent = true;
    } else if (char === ',') {
      fields.push(field);
      field = '';
      hasContent = true;
    } else if (char === '\r' || char === '\n') {
      if (char === '\r' && source[at + 1] === '\n') {
        at += 1;
      }
      if (endRecord()) {
        return { overLimit: true };
      }
    } else {
      field += char;
      hasContent = true;
    }
  }
  if ((isQuoted || hasContent || field !== '' || fields.length > 0) && endRecord()) {
    return { overLimit: true };
  }
  // An unclosed quote runs to the end of the file, as spreadsheet programs read it.
  return isQuoted
    ? { rows, problem: { message: UNCLOSED_QUOTE, row: quoteRow } }
    : { rows };
}

/** A sheet name from a file name: the base name without its directory and ".csv". */
export function sheetNameOfFile(fileName: string): string {
  const base = fileName.split(/[\\/]/u).pop() ?? fileName;
  return base.replace(/\.csv$/iu, '');
}

function hasUtf16Mark(bytes: Uint8Array): boolean {
  return (bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff);
}
