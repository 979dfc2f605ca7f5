/**
 * `@keelson/workbook`: uploaded spreadsheets (xlsx, CSV, zip of CSV files) to the typed supply
 * model of `@keelson/contracts`, with every problem located by sheet, row and column; and
 * supply models back to template workbooks. Pure: no Node built-ins, so it also runs in a
 * worker or a browser.
 */
export { DEFAULT_WORKBOOK_LIMITS, type WorkbookLimits } from './limits';
export type { SheetMapping, WorkbookMapping } from './sheet-layout';
export type { CsvFile } from './file-source';
export { readCsvFiles, readWorkbook, type ReadOptions, type ReadResult } from './read-workbook';
export { validateModel, type ModelProblems } from './validate-model';
export { writeTemplate, writeWorkbook } from './write-workbook';
export {
  REQUIRED_SHEETS,
  SHEET_HELP,
  TEMPLATE_FIELDS,
  type FieldKind,
  type FieldRange,
  type TemplateField,
} from './template-fields';
export {
  inspectCsvFiles,
  inspectWorkbook,
  type InspectedSheet,
  type InspectOptions,
  type SheetSuggestion,
  type WorkbookInspection,
} from './inspect-workbook';
export {
  ERROR_FILL_ARGB,
  WARNING_FILL_ARGB,
  writeErrorReport,
  type ErrorReportOptions,
} from './error-report';
