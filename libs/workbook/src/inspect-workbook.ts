/**
 * The import screen's column-mapping step: what a file holds (sheets, a guessed header row, the
 * headers and a few sample rows) and, per template sheet, which file sheet and headers look like
 * a match and what required sheets or columns are still missing. Suggestions use the template's
 * names and common alternatives (field-aliases.ts); the buyer confirms them as a mapping.
 */
import {
  SHEET_NAMES,
  type InspectedSheet,
  type SheetName,
  type SheetSuggestion,
  type WorkbookError,
  type WorkbookInspection,
} from '@keelson/contracts';
import { FIELD_ALIASES, SHEET_ALIASES } from './field-aliases';
import { loadCsvFiles, loadSource, type CsvFile, type LoadedSource } from './file-source';
import { resolveLimits, type WorkbookLimits } from './limits';
import { nameKey } from './name-key';
import { fileError } from './problems';
import {
  displayText,
  isBlank,
  isBlankRow,
  reportedValue,
  type RawRow,
  type RawSheet,
} from './raw-sheet';
import type { WorkbookMapping } from './sheet-layout';
import { REQUIRED_SHEETS, TEMPLATE_FIELDS } from './template-fields';

export type { InspectedSheet, SheetSuggestion, WorkbookInspection } from '@keelson/contracts';

/** Options of {@link inspectWorkbook}. */
export interface InspectOptions {
  fileName?: string;
  limits?: Partial<WorkbookLimits>;
  /** A mapping chosen so far; its choices take the place of the suggestions. */
  mapping?: WorkbookMapping;
}

const SAMPLE_ROWS = 5;
/** How many of a sheet's first non-blank rows the inspection sends for other header rows. */
export const TOP_ROWS = 25;
const HEADER_SEARCH_ROWS = 20;

/** Inspects an uploaded file for the mapping step; never throws for bad input. */
export async function inspectWorkbook(
  data: Uint8Array,
  options: InspectOptions = {},
): Promise<WorkbookInspection> {
  try {
    const source = await loadSource(data, resolveLimits(options.limits), options.fileName);
    return inspectionOf(source, options.mapping);
  } catch (error) {
    return inspectionOf({ format: 'xlsx', sheets: [], errors: [fileError(
      `the file cannot be read (${error instanceof Error ? error.message : String(error)})`)] },
    options.mapping);
  }
}

/** Inspects CSV files given one by one, as {@link inspectWorkbook} does. */
export async function inspectCsvFiles(
  files: readonly CsvFile[],
  options: Omit<InspectOptions, 'fileName'> = {},
): Promise<WorkbookInspection> {
  return inspectionOf(loadCsvFiles(files, resolveLimits(options.limits)), options.mapping);
}

/** The inspection of an already loaded file (shared with `readWorkbook({inspect: true})`). */
export function inspectionOf(
  source: LoadedSource,
  mapping: WorkbookMapping | undefined,
): WorkbookInspection {
  const sheets = source.sheets.map((sheet) => inspectSheet(sheet, guessHeaderRow(sheet, null)));
  const suggestions = {} as Record<SheetName, SheetSuggestion>;
  const claimed = new Set<string>();
  for (const template of SHEET_NAMES) {
    const chosen = mapping?.[template]?.sheetName;
    const byName = source.sheets.find((sheet) => chosen !== undefined
      ? nameKey(sheet.name) === nameKey(chosen)
      : [template, ...SHEET_ALIASES[template]]
        .some((name) => nameKey(name) === nameKey(sheet.name)));
    if (byName !== undefined) {
      claimed.add(byName.name);
    }
    suggestions[template] = { isRequired: REQUIRED_SHEETS.includes(template), sheetName:
      byName?.name ?? null, headerRow: null, columns: {}, unmatchedHeaders: [],
      missingColumns: TEMPLATE_FIELDS[template].filter((f) => f.required).map((f) => f.field) };
  }
  for (const template of SHEET_NAMES) {
    const suggestion = suggestions[template];
    if (suggestion.sheetName === null && mapping?.[template]?.sheetName === undefined) {
      // No sheet by name: offer the unclaimed sheet whose headers match most required fields.
      const best = bestByHeaders(template, source.sheets.filter((s) => !claimed.has(s.name)));
      if (best !== null) {
        suggestion.sheetName = best.name;
        claimed.add(best.name);
      }
    }
    const sheet = source.sheets.find((candidate) => candidate.name === suggestion.sheetName);
    if (sheet !== undefined) {
      fillColumns(suggestion, template, sheet, mapping);
    }
  }
  const missingSheets = REQUIRED_SHEETS.filter((sheet) => suggestions[sheet].sheetName === null);
  return { format: source.format, errors: source.errors, sheets, suggestions, missingSheets };
}

function fillColumns(
  suggestion: SheetSuggestion,
  template: SheetName,
  sheet: RawSheet,
  mapping: WorkbookMapping | undefined,
): void {
  const headerRow = mapping?.[template]?.headerRow ?? guessHeaderRow(sheet, template);
  suggestion.headerRow = headerRow;
  const headers = headerRow === null ? [] : headersOf(sheet, headerRow);
  const chosen = mapping?.[template]?.columns ?? {};
  const used = new Set<string>();
  for (const { field } of TEMPLATE_FIELDS[template]) {
    const wanted = chosen[field] !== undefined ? [nameKey(chosen[field])] : fieldKeys(field);
    const header = wanted
      .map((key) => headers.find((text) => nameKey(text) === key && !used.has(text)))
      .find((text) => text !== undefined);
    if (header !== undefined) {
      suggestion.columns[field] = header;
      used.add(header);
    }
  }
  suggestion.missingColumns = TEMPLATE_FIELDS[template]
    .filter((field) => field.required && suggestion.columns[field.field] === undefined)
    .map((field) => field.field);
  suggestion.unmatchedHeaders = headers.filter((text) => !used.has(text));
}

function inspectSheet(sheet: RawSheet, headerRow: number | null): InspectedSheet {
  const filled = sheet.rows.filter((row) => !isBlankRow(row));
  const samples = filled.filter((row) => headerRow === null || row.row > headerRow)
    .slice(0, SAMPLE_ROWS)
    .map((row) => row.cells.map((cell) => reportedValue(cell)));
  const topRows = filled.slice(0, TOP_ROWS).map((row) => ({
    row: row.row,
    cells: row.cells.map((cell) => reportedValue(cell)),
    headers: headersOf(sheet, row.row),
  }));
  return {
    name: sheet.name, rowCount: filled.length, headerRow,
    headers: headerRow === null ? [] : headersOf(sheet, headerRow), sampleRows: samples, topRows,
  };
}

/** The row among the first non-blank ones that matches the most field names. */
function guessHeaderRow(sheet: RawSheet, template: SheetName | null): number | null {
  const candidates = sheet.rows.filter((row) => !isBlankRow(row)).slice(0, HEADER_SEARCH_ROWS);
  let best: RawRow | undefined;
  let bestScore = 0;
  for (const row of candidates) {
    const score = template === null
      ? Math.max(...SHEET_NAMES.map((name) => headerScore(row, name)))
      : headerScore(row, template);
    if (score > bestScore) {
      best = row;
      bestScore = score;
    }
  }
  return (best ?? candidates[0])?.row ?? null;
}

function headerScore(row: RawRow, template: SheetName): number {
  const keys = new Set(row.cells.filter((cell) => typeof cell === 'string')
    .map((cell) => nameKey(cell as string)));
  return TEMPLATE_FIELDS[template].filter((field) =>
    fieldKeys(field.field).some((key) => keys.has(key))).length;
}

function bestByHeaders(template: SheetName, sheets: readonly RawSheet[]): RawSheet | null {
  let best: RawSheet | null = null;
  let bestScore = 0;
  const required = TEMPLATE_FIELDS[template].filter((field) => field.required);
  for (const sheet of sheets) {
    const row = sheet.rows.find((candidate) => candidate.row === guessHeaderRow(sheet, template));
    const keys = new Set((row?.cells ?? []).map((cell) => nameKey(displayText(cell))));
    const score = required.filter((field) => fieldKeys(field.field).some((key) => keys.has(key)))
      .length;
    if (score === required.length && score > bestScore) {
      best = sheet;
      bestScore = score;
    }
  }
  return best;
}

function headersOf(sheet: RawSheet, headerRow: number): string[] {
  const row = sheet.rows.find((candidate) => candidate.row === headerRow);
  return (row?.cells ?? []).filter((cell) => !isBlank(cell)).map((cell) => displayText(cell));
}

function fieldKeys(field: string): string[] {
  return [nameKey(field), ...(FIELD_ALIASES[field] ?? [])];
}
