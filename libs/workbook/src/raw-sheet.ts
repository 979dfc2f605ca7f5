/**
 * The reader's neutral form of a sheet: what an xlsx worksheet or a CSV file holds once its
 * cells are unwrapped (formula results, rich text, hyperlinks) and before any template rule is
 * applied. Both input formats meet here, so the rules are written once.
 */

/** A cell that holds no usable value: a formula error such as "#REF!", or a missing result. */
export interface CellFault {
  fault: string;
}

/** One unwrapped cell value; null for an empty cell. */
export type RawValue = string | number | boolean | Date | CellFault | null;

/** One row of a sheet with its own 1-based row number; `cells[0]` is column A. */
export interface RawRow {
  row: number;
  cells: RawValue[];
}

/** A sheet by its name as written in the file, rows in ascending order (gaps allowed). */
export interface RawSheet {
  name: string;
  rows: RawRow[];
}

/** Whether a value is a fault rather than a value. */
export function isFault(value: RawValue): value is CellFault {
  return typeof value === 'object' && value !== null && !(value instanceof Date);
}

/** Whether a value counts as blank: empty, or text of only white space. */
export function isBlank(value: RawValue | undefined): boolean {
  return value === null || value === undefined ||
    (typeof value === 'string' && value.trim() === '');
}

/** Whether every cell of a row is blank (such rows are skipped but keep their numbers). */
export function isBlankRow(row: RawRow): boolean {
  return row.cells.every((value) => isBlank(value));
}

/** A value as an error's `value` field: dates as ISO text, faults as their text. */
export function reportedValue(value: RawValue | undefined): string | number | boolean | null {
  if (value === null || value === undefined) {
    return null;
  }
  if (value instanceof Date) {
    return Number.isNaN(value.getTime()) ? 'invalid date' : value.toISOString();
  }
  if (isFault(value)) {
    return value.fault;
  }
  return value;
}

/** A value shown as text (attributes, free-text columns, previews). */
export function displayText(value: RawValue | undefined): string {
  if (value === null || value === undefined) {
    return '';
  }
  if (typeof value === 'number') {
    return Number.isInteger(value) ? integerText(value) : String(value);
  }
  if (typeof value === 'boolean') {
    return value ? 'TRUE' : 'FALSE';
  }
  if (value instanceof Date) {
    return isoDateText(value);
  }
  if (isFault(value)) {
    return value.fault;
  }
  return value.trim();
}

/** An integer-valued number as plain digits, also beyond 2^53 (no exponent form). */
export function integerText(value: number): string {
  if (Object.is(value, -0)) {
    return '0';
  }
  return Number.isSafeInteger(value) ? String(value) : BigInt(value).toString();
}

function isoDateText(value: Date): string {
  if (Number.isNaN(value.getTime())) {
    return 'invalid date';
  }
  const iso = value.toISOString();
  return iso.endsWith('T00:00:00.000Z') ? iso.slice(0, 10) : iso;
}
