/**
 * Building and ordering located problems (spec 8.16 and 8.17): errors and warnings are sorted by
 * sheet in workbook order, then by row, then by column, so a buyer can work down the list.
 */
import type { WorkbookError, WorkbookWarning } from '@keelson/contracts';

/** Orders sheets for sorting; `null` (the whole file) comes first, unknown sheets last. */
export type SheetOrder = (sheet: string | null) => number;

/** A sheet order from the file's own sheet names, then any other names in the given order. */
export function sheetOrderOf(fileSheets: readonly string[], others: readonly string[]): SheetOrder {
  const order = new Map<string, number>();
  for (const name of [...fileSheets, ...others]) {
    if (!order.has(name)) {
      order.set(name, order.size + 1);
    }
  }
  return (sheet) => (sheet === null ? 0 : (order.get(sheet) ?? order.size + 1));
}

/** Errors sorted by sheet, row (null first) and column letter; the sort is stable. */
export function sortErrors(errors: readonly WorkbookError[], order: SheetOrder): WorkbookError[] {
  return [...errors].sort(
    (left, right) =>
      order(left.sheet) - order(right.sheet) ||
      (left.row ?? 0) - (right.row ?? 0) ||
      columnRank(left.cell) - columnRank(right.cell),
  );
}

/** Warnings sorted by sheet and row; the sort is stable. */
export function sortWarnings(
  warnings: readonly WorkbookWarning[],
  order: SheetOrder,
): WorkbookWarning[] {
  return [...warnings].sort(
    (left, right) => order(left.sheet) - order(right.sheet) || (left.row ?? 0) - (right.row ?? 0),
  );
}

/** An error for the whole file (no sheet, row or column). */
export function fileError(message: string): WorkbookError {
  return { sheet: null, row: null, column: null, value: null, message };
}

function columnRank(cell: string | undefined): number {
  if (cell === undefined) {
    return 0;
  }
  let rank = 0;
  for (const char of cell) {
    if (char < 'A' || char > 'Z') {
      break;
    }
    rank = rank * 26 + (char.charCodeAt(0) - 64);
  }
  return rank;
}
