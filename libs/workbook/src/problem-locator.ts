/**
 * Places a model-level problem in the file: the file's own sheet name and the cell of a field in
 * a row. Models built in code have no file, so the plain locator names the template sheets and
 * gives no cells.
 */
import type { SheetName, WorkbookError } from '@keelson/contracts';
import { cellReference } from './name-key';
import type { SheetLayout } from './sheet-layout';

/** Maps template sheets and fields to the file's sheets and cells. */
export interface ProblemLocator {
  /** The sheet name to report for a template sheet. */
  sheet(template: SheetName): string;
  /** The cell of `field` in `row`, when the file has that column. */
  cell(template: SheetName, field: string, row: number | null): string | undefined;
}

/** The locator of models built in code: template names, no cells. */
export const TEMPLATE_LOCATOR: ProblemLocator = {
  sheet: (template) => template,
  cell: () => undefined,
};

/** A locator over the sheets and columns found in a file. */
export function layoutLocator(layouts: Partial<Record<SheetName, SheetLayout>>): ProblemLocator {
  return {
    sheet: (template) => layouts[template]?.sheet.name ?? template,
    cell: (template, field, row) => {
      const index = layouts[template]?.columns.get(field);
      return index === undefined || row === null ? undefined : cellReference(index + 1, row);
    },
  };
}

/** Builds errors located through a locator. */
export function errorFactory(locator: ProblemLocator) {
  return (
    template: SheetName,
    row: number | undefined,
    column: string,
    value: WorkbookError['value'],
    message: string,
  ): WorkbookError => {
    const located: WorkbookError = {
      sheet: locator.sheet(template), row: row ?? null, column, value, message,
    };
    const cell = locator.cell(template, column, row ?? null);
    if (cell !== undefined) {
      located.cell = cell;
    }
    return located;
  };
}

/** The error builder returned by {@link errorFactory}. */
export type MakeError = ReturnType<typeof errorFactory>;
