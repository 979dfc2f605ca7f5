/**
 * The comparison as a workbook: one sheet per section of {@link RunComparisonDto} (new single
 * points of failure, gone ones, risers, fallers, suppliers added, suppliers removed), each with
 * the same columns, and an "About" sheet saying what the runs are, what each section means and
 * that the scores support a decision rather than make it.
 */
import ExcelJS from 'exceljs';
import type { ComparisonRowDto, RunComparisonDto } from '@keelson/contracts';
import { MOVERS_LIMIT } from './comparison.service';

/** The section sheets in order: name, the DTO field, and what the section means. */
export const COMPARISON_SECTIONS = [
  { sheet: 'New single points', field: 'newSinglePoints', meaning: 'Suppliers that are a ' +
    'single point of failure in the later run and were not one in the earlier run (or were ' +
    'not in it).' },
  { sheet: 'Gone single points', field: 'goneSinglePoints', meaning: 'Suppliers that were a ' +
    'single point of failure in the earlier run and are not one in the later run (or are ' +
    'gone).' },
  { sheet: 'Risers', field: 'risers', meaning: `The ${MOVERS_LIMIT} suppliers in both runs ` +
    'whose rating rose most; with an equal rating, a rise in revenue impact counts; ties by ' +
    'code.' },
  { sheet: 'Fallers', field: 'fallers', meaning: `The ${MOVERS_LIMIT} suppliers in both runs ` +
    'whose rating fell most; with an equal rating, a fall in revenue impact counts; ties by ' +
    'code.' },
  { sheet: 'Suppliers added', field: 'suppliersAdded', meaning: 'Suppliers in the later run ' +
    'that were not in the earlier one.' },
  { sheet: 'Suppliers removed', field: 'suppliersRemoved', meaning: 'Suppliers in the earlier ' +
    'run that are not in the later one.' },
] as const satisfies readonly { sheet: string; field: keyof RunComparisonDto;
  meaning: string }[];

/** The name of the explanation sheet. */
export const COMPARISON_ABOUT_SHEET = 'About';

/** Column headers of every section sheet, in order. */
export const COMPARISON_EXPORT_COLUMNS = [
  'Supplier code', 'Supplier name', 'Tier', 'Rating before', 'Band before', 'Rating after',
  'Band after', 'Rating change', 'Revenue impact before', 'Revenue impact after',
  'Revenue impact change', 'Single point before', 'Single point after',
] as const;

/** Builds the export workbook's bytes. */
export async function buildComparisonWorkbook(comparison: RunComparisonDto, generatedAt: Date):
  Promise<Uint8Array> {
  const workbook = new ExcelJS.Workbook();
  workbook.created = generatedAt;
  for (const section of COMPARISON_SECTIONS) {
    const sheet = workbook.addWorksheet(section.sheet,
      { views: [{ state: 'frozen', ySplit: 1 }] });
    sheet.addRow([...COMPARISON_EXPORT_COLUMNS]).font = { bold: true };
    for (const row of comparison[section.field]) sheet.addRow(cells(row));
    sheet.columns.forEach((column, index) => { column.width = index === 1 ? 36 : 16; });
  }
  const about = workbook.addWorksheet(COMPARISON_ABOUT_SHEET);
  about.getColumn(1).width = 110;
  for (const line of comparisonAboutLines(comparison, generatedAt)) about.addRow([line]);
  about.getRow(1).font = { bold: true };
  const buffer = await workbook.xlsx.writeBuffer();
  return new Uint8Array(buffer as ArrayBuffer);
}

/** The lines of the "About" sheet. */
export function comparisonAboutLines(comparison: RunComparisonDto, generatedAt: Date): string[] {
  const name = (run: RunComparisonDto['fromRun']) => `run ${run.id} "${run.label}"` +
    `${run.quarterLabel ? ` (re-scoring ${run.quarterLabel})` : ''}, network version ` +
    `${run.networkVersionId}, finished ${run.finishedAt ?? 'not yet'}`;
  return [
    'About this comparison',
    `Exported ${generatedAt.toISOString()}.`,
    `Earlier: ${name(comparison.fromRun)}.`,
    `Later: ${name(comparison.toRun)}.`,
    '',
    ...COMPARISON_SECTIONS.map((section) => `${section.sheet} ` +
      `(${comparison[section.field].length}): ${section.meaning}`),
    '',
    'Suppliers are matched by supplier code. A change is the later value minus the earlier ' +
      'one; a supplier missing from a run counts as 0 there.',
    'Rating = impact band (1-5) x likelihood (1-5), as computed in each run (before any ' +
      'override in the register). Revenue impact: the revenue lost if the supplier fails ' +
      'alone (weekly revenue x lost weeks over its lost products).',
    'These scores are decision support. The company\'s own procedures decide what is done.',
  ];
}

function cells(row: ComparisonRowDto): (string | number)[] {
  const yesNo = (value: boolean | undefined) => value === undefined ? '' : value ? 'yes' : 'no';
  return [
    row.code, row.name, row.tier ?? '', row.before?.rating ?? '', row.before?.ratingBand ?? '',
    row.after?.rating ?? '', row.after?.ratingBand ?? '', row.ratingChange,
    row.before?.revenueImpact ?? '', row.after?.revenueImpact ?? '', row.revenueImpactChange,
    yesNo(row.before?.singlePointOfFailure), yesNo(row.after?.singlePointOfFailure),
  ];
}
