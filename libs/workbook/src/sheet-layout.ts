/**
 * Finds each template sheet in a file and its columns: sheet and header names match by their
 * keys (spec 8.1, 8.2), or as the import screen's mapping says. Problems with the layout (a
 * missing sheet or required column, two headers for one field) are errors located at the
 * header row; data rows are read elsewhere.
 */
import {
  SHEET_NAMES,
  type SheetMapping,
  type SheetName,
  type WorkbookError,
  type WorkbookMapping,
} from '@keelson/contracts';
import { cellReference, nameKey } from './name-key';
import { displayText, isBlank, type RawSheet } from './raw-sheet';
import { REQUIRED_SHEETS, TEMPLATE_FIELDS } from './template-fields';

export type { SheetMapping, WorkbookMapping } from '@keelson/contracts';

/** An extra column, kept as an attribute under its header as written. */
export interface ExtraColumn {
  header: string;
  /** 0-based column index. */
  index: number;
}

/** Where a template sheet's data lies in the file. */
export interface SheetLayout {
  template: SheetName;
  sheet: RawSheet;
  headerRow: number;
  /** Template field -> 0-based column index, for the fields the file has. */
  columns: Map<string, number>;
  extras: ExtraColumn[];
}

/** Layouts of the template sheets found, and the layout errors. */
export interface LayoutOutcome {
  layouts: Partial<Record<SheetName, SheetLayout>>;
  errors: WorkbookError[];
}

/** Locates every template sheet and its columns. */
export function locateSheets(
  sheets: readonly RawSheet[],
  mapping: WorkbookMapping | undefined,
): LayoutOutcome {
  const layouts: Partial<Record<SheetName, SheetLayout>> = {};
  const errors: WorkbookError[] = [];
  for (const template of SHEET_NAMES) {
    const sheetMapping = mapping?.[template] ?? {};
    const sheet = findSheet(sheets, template, sheetMapping, errors);
    if (sheet === undefined) {
      continue;
    }
    const layout = layoutSheet(template, sheet, sheetMapping, errors);
    if (layout !== undefined) {
      layouts[template] = layout;
    }
  }
  return { layouts, errors };
}

function findSheet(
  sheets: readonly RawSheet[],
  template: SheetName,
  mapping: SheetMapping,
  errors: WorkbookError[],
): RawSheet | undefined {
  const wanted = mapping.sheetName ?? template;
  const exact = sheets.find((sheet) => sheet.name === wanted);
  const matches = exact !== undefined
    ? [exact]
    : sheets.filter((sheet) => nameKey(sheet.name) === nameKey(wanted));
  if (matches.length > 1) {
    const names = matches.map((sheet) => `"${sheet.name}"`).join(' and ');
    errors.push({ sheet: null, row: null, column: null, value: null,
      message: `sheets ${names} both match the sheet ${template}; rename one of them` });
    return undefined;
  }
  // An optional sheet may be absent, unless the mapping explicitly points at one.
  const isExpected = REQUIRED_SHEETS.includes(template) || mapping.sheetName !== undefined;
  if (matches.length === 0 && isExpected) {
    const message = mapping.sheetName === undefined
      ? `the sheet ${template} is missing`
      : `the sheet "${mapping.sheetName}" chosen for ${template} is not in the file`;
    errors.push({ sheet: template, row: null, column: null, value: null, message });
  }
  return matches[0];
}

function layoutSheet(
  template: SheetName,
  sheet: RawSheet,
  mapping: SheetMapping,
  errors: WorkbookError[],
): SheetLayout | undefined {
  const headerRow = mapping.headerRow ?? 1;
  const isRequired = REQUIRED_SHEETS.includes(template);
  const fields = TEMPLATE_FIELDS[template];
  const at = (column: string | null, value: string | null, message: string, index?: number) => {
    const located: WorkbookError = { sheet: sheet.name, row: headerRow, column, value, message };
    if (index !== undefined) {
      located.cell = cellReference(index + 1, headerRow);
    }
    errors.push(located);
  };
  if (!Number.isInteger(headerRow) || headerRow < 1) {
    at(null, String(headerRow), `the header row must be a whole number from 1; got ${headerRow}`);
    return undefined;
  }
  const header = sheet.rows.find((row) => row.row === headerRow);
  if (header === undefined || header.cells.every((cell) => isBlank(cell))) {
    // An optional sheet left empty is simply absent; a required one cannot be read.
    if (isRequired || sheet.rows.some((row) => row.row > headerRow)) {
      at(null, null, `the sheet has no headers in row ${headerRow}`);
    }
    return isRequired ? undefined : { template, sheet, headerRow, columns: new Map(), extras: [] };
  }
  const mappedColumns = mapping.columns ?? {};
  const headerToField = new Map<string, string>();
  for (const [field, headerText] of Object.entries(mappedColumns)) {
    if (!fields.some((entry) => entry.field === field)) {
      at(null, headerText, `the mapping names "${field}", which is not a column of ${template}`);
      continue;
    }
    headerToField.set(nameKey(headerText), field);
  }
  for (const { field } of fields) {
    if (!(field in mappedColumns) && !headerToField.has(nameKey(field))) {
      headerToField.set(nameKey(field), field);
    }
  }
  const columns = new Map<string, number>();
  const extras: ExtraColumn[] = [];
  header.cells.forEach((cell, index) => {
    if (isBlank(cell)) {
      return;
    }
    const text = displayText(cell);
    const field = headerToField.get(nameKey(text));
    if (field === undefined) {
      const twin = extras.find((extra) => extra.header === text);
      if (twin === undefined) {
        extras.push({ header: text, index });
      } else {
        at(null, text, `two columns have the header "${text}"; rename one`, index);
      }
    } else if (columns.has(field)) {
      at(field, text, `two headers map to ${field}: "${displayText(header.cells[
        columns.get(field) as number])}" and "${text}"; keep one`, index);
    } else {
      columns.set(field, index);
    }
  });
  for (const { field, required } of fields) {
    if (columns.has(field)) {
      continue;
    }
    if (field in mappedColumns) {
      at(field, mappedColumns[field] ?? null,
        `the header "${mappedColumns[field]}" chosen for ${field} is not in row ${headerRow}`);
    } else if (required) {
      at(field, null, `the required column ${field} is missing (headers are read from row ` +
        `${headerRow})`);
    }
  }
  return { template, sheet, headerRow, columns, extras };
}
