/**
 * The reader's entry points: bytes (or CSV files) in, a typed supply model or located errors
 * out. Reading runs in stages (load the file within its limits, locate sheets and columns, read
 * cells, check the model) and every stage adds errors instead of stopping, so one upload shows
 * every problem. Nothing here throws for bad input.
 */
import {
  SHEET_NAMES,
  type SheetName,
  type SupplyModel,
  type WorkbookError,
  type WorkbookInspection,
  type WorkbookWarning,
} from '@keelson/contracts';
import { loadCsvFiles, loadSource, type CsvFile, type LoadedSource } from './file-source';
import { inspectionOf } from './inspect-workbook';
import { resolveLimits, type WorkbookLimits } from './limits';
import { layoutLocator } from './problem-locator';
import { fileError, sheetOrderOf, sortErrors, sortWarnings } from './problems';
import { readRecords } from './sheet-records';
import { locateSheets, type SheetLayout, type WorkbookMapping } from './sheet-layout';
import { TEMPLATE_FIELDS } from './template-fields';
import { checkModel } from './validate-model';

/** Options of {@link readWorkbook} and {@link readCsvFiles}. */
export interface ReadOptions {
  /** The upload's file name; used only to name the sheet of a single CSV file. */
  fileName?: string;
  /** Overrides of {@link DEFAULT_WORKBOOK_LIMITS}. */
  limits?: Partial<WorkbookLimits>;
  /** Where the template sheets and columns are in the file, when not under their own names. */
  mapping?: WorkbookMapping;
  /** Also inspect the file for the mapping step, from the same parse (`result.inspection`). */
  inspect?: boolean;
}

/** The outcome of reading a file. */
export interface ReadResult {
  /** The model, or null when there is any error. */
  model: SupplyModel | null;
  /** Every error, sorted by sheet (workbook order), then row. */
  errors: WorkbookError[];
  /** Every warning (spec 8.16), sorted the same way. */
  warnings: WorkbookWarning[];
  /** Data rows read per template sheet (blank rows not counted). */
  counts: Partial<Record<SheetName, number>>;
  /** The input's format, told by content: an .xlsx, one CSV file, or a zip of CSV files. */
  format: 'xlsx' | 'csv' | 'zip';
  /** With `inspect: true`: what {@link inspectWorkbook} would give for the same file. */
  inspection?: WorkbookInspection;
}

/** Sheets that must hold at least one data row for a network to make sense. */
const NON_EMPTY_SHEETS: readonly SheetName[] = ['Plants', 'Products'];

/**
 * Reads an uploaded file into a supply model. The format is detected by content (the zip
 * signature PK\x03\x04 means an .xlsx or a zip of CSV files; other text is one CSV file), never
 * by name; a PNG or random bytes give one error "not a spreadsheet ...". Bad input never
 * throws: it becomes located errors, with sheet, row and column null where none applies.
 */
export async function readWorkbook(
  data: Uint8Array,
  options: ReadOptions = {},
): Promise<ReadResult> {
  try {
    const limits = resolveLimits(options.limits);
    const source = await loadSource(data, limits, options.fileName);
    const result = resultOf(source, options.mapping);
    return options.inspect ? { ...result, inspection: inspectionOf(source, options.mapping) } : result;
  } catch (error) {
    const result = unexpected(error, 'xlsx');
    if (!options.inspect) return result;
    const failed = { format: result.format, sheets: [], errors: result.errors };
    return { ...result, inspection: inspectionOf(failed, options.mapping) };
  }
}

/**
 * Reads one CSV file per sheet; a file's sheet name is its name without ".csv", matched like
 * sheet names (case-insensitive, spaces and underscores ignored).
 */
export async function readCsvFiles(
  files: readonly CsvFile[],
  options: Omit<ReadOptions, 'fileName'> = {},
): Promise<ReadResult> {
  try {
    const limits = resolveLimits(options.limits);
    return resultOf(loadCsvFiles(files, limits), options.mapping);
  } catch (error) {
    return unexpected(error, 'csv');
  }
}

function resultOf(source: LoadedSource, mapping: WorkbookMapping | undefined): ReadResult {
  const order = sheetOrderOf(source.sheets.map((sheet) => sheet.name), SHEET_NAMES);
  if (source.errors.length > 0 && source.sheets.length === 0) {
    return { model: null, errors: sortErrors(source.errors, order), warnings: [], counts: {},
      format: source.format };
  }
  const errors: WorkbookError[] = [...source.errors];
  if (source.sheets.length === 0) {
    errors.push(fileError('the workbook has no sheets'));
  }
  const { layouts, errors: layoutErrors } = locateSheets(source.sheets, mapping);
  errors.push(...layoutErrors);
  if (source.sheets.length > 0 && Object.keys(layouts).length === 0) {
    const names = SHEET_NAMES.join(', ');
    errors.push(fileError(`the file holds none of the template's sheets (${names})`));
  }
  const { model, counts, errors: cellErrors } = readRecords(layouts);
  errors.push(...cellErrors);
  for (const sheet of NON_EMPTY_SHEETS) {
    const layout = layouts[sheet];
    if (layout !== undefined && counts[sheet] === 0) {
      errors.push({ sheet: layout.sheet.name, row: null, column: null, value: null,
        message: `the sheet ${layout.sheet.name} has no data rows below its headers` });
    }
  }
  const checked = checkModel(model, {
    locator: layoutLocator(layouts),
    incompleteSheets: incompleteSheets(layouts),
  });
  errors.push(...checked.errors);
  const sorted = sortErrors(errors, order);
  return {
    model: sorted.length === 0 ? model : null,
    errors: sorted,
    warnings: sortWarnings(checked.warnings, order),
    counts,
    format: source.format,
  };
}

/** Template sheets not found, or found without one of their required code columns. */
function incompleteSheets(layouts: Partial<Record<SheetName, SheetLayout>>): Set<SheetName> {
  const incomplete = new Set<SheetName>();
  for (const sheet of SHEET_NAMES) {
    const layout = layouts[sheet];
    const hasCodes = layout !== undefined && TEMPLATE_FIELDS[sheet]
      .filter((field) => field.required && field.kind === 'code')
      .every((field) => layout.columns.has(field.field));
    if (!hasCodes) {
      incomplete.add(sheet);
    }
  }
  return incomplete;
}

function unexpected(error: unknown, format: ReadResult['format']): ReadResult {
  const detail = error instanceof Error ? error.message : String(error);
  return {
    model: null,
    errors: [fileError(`the file cannot be read (${detail.slice(0, 200)})`)],
    warnings: [],
    counts: {},
    format,
  };
}
