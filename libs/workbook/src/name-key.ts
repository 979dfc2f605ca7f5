/**
 * Header and sheet names are compared by a key: lower case, with spaces and underscores dropped
 * (spec 1 and 8.1), so "Supplier Code", "SUPPLIER_CODE" and "suppliercode" are one name.
 */

/** The comparison key of a header or sheet name. */
export function nameKey(name: string): string {
  return name.normalize('NFC').replace(/[\s_]+/gu, '').toLowerCase();
}

/** The 1-based column number as letters: 1 -> "A", 27 -> "AA". */
export function columnLetters(column: number): string {
  let letters = '';
  let rest = column;
  while (rest > 0) {
    const digit = (rest - 1) % 26;
    letters = String.fromCharCode(65 + digit) + letters;
    rest = Math.floor((rest - 1) / 26);
  }
  return letters;
}

/** A cell reference such as "D7" from a 1-based column and row. */
export function cellReference(column: number, row: number): string {
  return `${columnLetters(column)}${row}`;
}
