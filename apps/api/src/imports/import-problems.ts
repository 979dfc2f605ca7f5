/**
 * The problems table of a batch: its stored errors and warnings as one list, filtered, sorted
 * and paged in the service (a batch holds at most a few hundred thousand problems, all in its
 * row already, so there is nothing for SQL to do).
 */
import type { ImportProblemDto, ListImportProblemsQuery, Page } from '@keelson/contracts';
import type { ImportBatchRow, StoredProblem } from '@keelson/db';

/** Every problem of a batch, errors first, in the order the reader found them. */
export function problemsOf(batch: ImportBatchRow): ImportProblemDto[] {
  const toDto = (kind: ImportProblemDto['kind']) => (problem: StoredProblem): ImportProblemDto => ({
    kind,
    sheet: problem.sheet,
    row: problem.row,
    column: problem.column,
    value: problem.value,
    message: problem.message,
    cell: problem.cell ?? null,
  });
  return [...batch.errors.map(toDto('error')), ...batch.warnings.map(toDto('warning'))];
}

/** One page of `problems` as the query asks: filters, then a stable sort, then the page. */
export function pageOfProblems(
  problems: readonly ImportProblemDto[],
  query: ListImportProblemsQuery,
): Page<ImportProblemDto> {
  const needle = query.q?.toLowerCase();
  const sheet = query.sheet?.toLowerCase();
  const matching = problems
    .map((problem, index) => ({ problem, index }))
    .filter(({ problem }) =>
      (query.kind === undefined || problem.kind === query.kind) &&
      (!sheet || (problem.sheet ?? '').toLowerCase() === sheet) &&
      (!needle || [problem.column, problem.value, problem.message]
        .some((text) => text !== null && String(text).toLowerCase().includes(needle))));
  const direction = query.order === 'desc' ? -1 : 1;
  matching.sort((a, b) =>
    direction * compareField(a.problem, b.problem, query.sort) || a.index - b.index);
  return {
    items: matching.slice(query.offset, query.offset + query.limit).map(({ problem }) => problem),
    total: matching.length,
  };
}

/**
 * Compares by one field; missing values (file-level problems) come first in ascending order.
 * Sheets tie-break by row so that "sort by sheet" reads like the file.
 */
function compareField(
  a: ImportProblemDto,
  b: ImportProblemDto,
  field: ListImportProblemsQuery['sort'],
): number {
  if (field === 'row') {
    return compareNullable(a.row, b.row, (x, y) => x - y);
  }
  if (field === 'sheet') {
    return compareNullable(a.sheet, b.sheet, compareText) ||
      compareNullable(a.row, b.row, (x, y) => x - y);
  }
  const left = a[field];
  const right = b[field];
  if (typeof left === 'number' && typeof right === 'number') {
    return left - right;
  }
  return compareNullable(left === null ? null : String(left),
    right === null ? null : String(right), compareText);
}

function compareNullable<T>(a: T | null, b: T | null, compare: (x: T, y: T) => number): number {
  if (a === null || b === null) {
    return a === null ? (b === null ? 0 : -1) : 1;
  }
  return compare(a, b);
}

const collator = new Intl.Collator('en', { sensitivity: 'base', numeric: true });

function compareText(a: string, b: string): number {
  return collator.compare(a, b);
}
