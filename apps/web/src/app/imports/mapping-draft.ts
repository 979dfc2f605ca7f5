import {
  SHEET_NAMES,
  type SheetMapping,
  type SheetName,
  type WorkbookInspection,
  type WorkbookMapping,
} from '@keelson/contracts';
import { TEMPLATE_FIELDS } from '@keelson/workbook/fields';

/** What the buyer has chosen so far for one template sheet on the mapping step. */
export interface SheetMappingDraft {
  /** The file's sheet, or null when none is chosen (an optional sheet left out). */
  sheetName: string | null;
  /** The 1-based header row, or null for the file's own guess. */
  headerRow: number | null;
  /** Template field -> the file's header; a field left out has no key. */
  columns: Record<string, string>;
}

/** The mapping step's choices, one entry per template sheet. */
export type MappingDraft = Record<SheetName, SheetMappingDraft>;

/**
 * The first draft for a file: the inspection's suggestions (sheet, header row, columns), with
 * the mapping the batch was last checked with laid over them, so a buyer who comes back to
 * the step sees what they chose before.
 */
export function draftFromInspection(
  inspection: WorkbookInspection,
  previous: WorkbookMapping | null = null,
): MappingDraft {
  const draft = {} as MappingDraft;
  for (const sheet of SHEET_NAMES) {
    const suggestion = inspection.suggestions[sheet];
    const chosen: SheetMapping = previous?.[sheet] ?? {};
    const sheetName = chosen.sheetName ?? suggestion?.sheetName ?? null;
    const sameSheet = sheetName === (suggestion?.sheetName ?? null);
    draft[sheet] = {
      sheetName,
      headerRow: chosen.headerRow ?? (sameSheet ? (suggestion?.headerRow ?? null) : null),
      columns: { ...(sameSheet ? suggestion?.columns : {}), ...chosen.columns },
    };
  }
  return draft;
}

/** The draft as the API takes it: chosen sheets only, blank choices left out. */
export function toWorkbookMapping(draft: MappingDraft): WorkbookMapping {
  const mapping: WorkbookMapping = {};
  for (const sheet of SHEET_NAMES) {
    const entry = draft[sheet];
    if (!entry.sheetName) {
      continue;
    }
    const columns = Object.fromEntries(
      Object.entries(entry.columns).filter(([, header]) => header.trim() !== ''),
    );
    const sheetMapping: SheetMapping = { sheetName: entry.sheetName };
    if (entry.headerRow !== null) {
      sheetMapping.headerRow = entry.headerRow;
    }
    if (Object.keys(columns).length > 0) {
      sheetMapping.columns = columns;
    }
    mapping[sheet] = sheetMapping;
  }
  return mapping;
}

/** Required fields of a template sheet that have no header chosen in the draft. */
export function missingFields(draft: MappingDraft, sheet: SheetName): string[] {
  const columns = draft[sheet].columns;
  return TEMPLATE_FIELDS[sheet]
    .filter((field) => field.required && !columns[field.field])
    .map((field) => field.field);
}

/** A copy of the draft with one sheet's entry changed. */
export function withSheet(
  draft: MappingDraft,
  sheet: SheetName,
  change: Partial<SheetMappingDraft>,
): MappingDraft {
  return { ...draft, [sheet]: { ...draft[sheet], ...change } };
}

/** A copy of the draft with one field's header chosen (or cleared with an empty string). */
export function withColumn(
  draft: MappingDraft,
  sheet: SheetName,
  field: string,
  header: string,
): MappingDraft {
  const columns = { ...draft[sheet].columns };
  if (header) {
    columns[field] = header;
  } else {
    delete columns[field];
  }
  return withSheet(draft, sheet, { columns });
}

/** Header text reduced for comparison: lower case, runs of spaces, dashes and dots as `_`. */
function headerKey(header: string): string {
  return header.trim().toLowerCase().replace(/[\s\-.]+/g, '_');
}

/**
 * A copy of the draft with another file sheet chosen for a template sheet. The suggested sheet
 * brings back its suggestions; any other sheet starts from its own header row guess and from
 * headers that spell a field's name (so "Plant Code" maps to `plant_code`).
 */
export function withFileSheet(
  draft: MappingDraft,
  sheet: SheetName,
  sheetName: string | null,
  inspection: WorkbookInspection,
): MappingDraft {
  const suggestion = inspection.suggestions[sheet];
  if (sheetName !== null && sheetName === suggestion?.sheetName) {
    return withSheet(draft, sheet, {
      sheetName,
      headerRow: suggestion.headerRow,
      columns: { ...suggestion.columns },
    });
  }
  const fileSheet = inspection.sheets.find((candidate) => candidate.name === sheetName);
  const columns: Record<string, string> = {};
  for (const field of TEMPLATE_FIELDS[sheet]) {
    const header = fileSheet?.headers.find((text) => headerKey(text) === field.field);
    if (header) {
      columns[field.field] = header;
    }
  }
  return withSheet(draft, sheet, {
    sheetName,
    headerRow: fileSheet?.headerRow ?? null,
    columns,
  });
}
