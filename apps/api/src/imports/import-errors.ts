/** The 422 answer of a file with errors, and how a problem reads in a sentence. */
import { INVALID_WORKBOOK, type WorkbookError } from '@keelson/contracts';
import { AppError } from '../http/app-error';

/** Most error details a 422 answer lists; the problems route pages through all of them. */
export const MAX_ERROR_DETAILS = 1000;

/** 422 `invalid_workbook`: every error located (up to {@link MAX_ERROR_DETAILS}). */
export function invalidWorkbook(batchId: number, errors: readonly WorkbookError[]): AppError {
  const first = errors[0];
  const summary = errors.length === 1 ? 'an error' : `${errors.length} errors`;
  const listed = errors.length > MAX_ERROR_DETAILS
    ? ` The first ${MAX_ERROR_DETAILS} are listed; GET /api/imports/${batchId}/problems has all.`
    : '';
  const message = `The file has ${summary}, so nothing was imported (import ${batchId} is ` +
    `recorded).${first ? ` First: ${describeProblem(first)}.` : ''}${listed}`;
  const details = errors.slice(0, MAX_ERROR_DETAILS).map((error) => ({ sheet: error.sheet,
    row: error.row, column: error.column, value: error.value, message: error.message }));
  return new AppError(INVALID_WORKBOOK, 422, message, details);
}

/** "Suppliers row 5, cell A5: duplicate ..." or the message alone for file-level problems. */
export function describeProblem(error: WorkbookError): string {
  const place = [
    error.sheet,
    error.row === null ? null : `row ${error.row}`,
    error.cell ? `cell ${error.cell}` : error.column,
  ].filter((part): part is string => Boolean(part)).join(', ');
  return place ? `${place}: ${error.message}` : error.message;
}
