/**
 * Code-point order of strings (spec 8.15: `suppliers`, `scenario.failed` and `productsLost` are
 * sorted by code in code-point order). JavaScript's `<` compares UTF-16 code units, which differs
 * from code-point order only when a surrogate (U+D800-U+DFFF) meets a unit in U+E000-U+FFFF; the
 * fix-up below moves surrogates above that range, the usual trick for code-point comparison.
 */

/** Compares two strings by Unicode code points: negative, zero or positive. */
export function compareCodePoints(a: string, b: string): number {
  const length = Math.min(a.length, b.length);
  for (let i = 0; i < length; i++) {
    let x = a.charCodeAt(i);
    let y = b.charCodeAt(i);
    if (x === y) continue;
    if (x >= 0xd800 && y >= 0xd800) {
      x = x >= 0xe000 ? x - 0x800 : x + 0x2000;
      y = y >= 0xe000 ? y - 0x800 : y + 0x2000;
    }
    return x - y;
  }
  return a.length - b.length;
}

/** A sorted copy of the codes in code-point order, without repeats. */
export function sortedUniqueCodes(codes: Iterable<string>): string[] {
  return [...new Set(codes)].sort(compareCodePoints);
}
