/**
 * Reads the data rows of located sheets into the typed records of the supply model. Each cell is
 * read by its column's kind; an unreadable or missing required value is an error at its cell.
 * A row whose codes are readable is kept even when another cell is not (with the column's
 * default in its place), so references to it do not raise follow-on errors; the model is
 * withheld anyway while any error remains.
 */
import type { SheetName, SupplyModel, WorkbookError } from '@keelson/contracts';
import {
  faultMessage,
  readCode,
  readNumber,
  readText,
  readYesNo,
  type CellReading,
} from './cell-values';
import { cellReference } from './name-key';
import { isBlankRow, isFault, reportedValue, displayText, isBlank } from './raw-sheet';
import type { RawValue } from './raw-sheet';
import type { SheetLayout } from './sheet-layout';
import { TEMPLATE_FIELDS, type TemplateField } from './template-fields';

/** The records read, the data rows counted per sheet, and the cell errors. */
export interface RecordsOutcome {
  model: SupplyModel;
  counts: Partial<Record<SheetName, number>>;
  errors: WorkbookError[];
}

const MODEL_KEYS: Record<SheetName, keyof SupplyModel> = {
  Plants: 'plants',
  Products: 'products',
  BOM: 'bom',
  Suppliers: 'suppliers',
  Sourcing: 'sourcing',
  Stock: 'stock',
};

/** Reads every data row of every located sheet. */
export function readRecords(layouts: Partial<Record<SheetName, SheetLayout>>): RecordsOutcome {
  const model: SupplyModel = {
    plants: [], products: [], bom: [], suppliers: [], sourcing: [], stock: [],
  };
  const counts: Partial<Record<SheetName, number>> = {};
  const errors: WorkbookError[] = [];
  for (const layout of Object.values(layouts)) {
    const records = model[MODEL_KEYS[layout.template]] as unknown as Record<string, unknown>[];
    counts[layout.template] = readSheetRows(layout, records, errors);
  }
  return { model, counts, errors };
}

function readSheetRows(
  layout: SheetLayout,
  records: Record<string, unknown>[],
  errors: WorkbookError[],
): number {
  const fields = TEMPLATE_FIELDS[layout.template];
  let count = 0;
  for (const row of layout.sheet.rows) {
    if (row.row <= layout.headerRow || isBlankRow(row)) {
      continue;
    }
    count += 1;
    const record: Record<string, unknown> = {};
    let isIdentified = true;
    for (const field of fields) {
      const index = layout.columns.get(field.field);
      const raw = index === undefined ? null : (row.cells[index] ?? null);
      const fail = (message: string) => {
        errors.push({
          sheet: layout.sheet.name, row: row.row, column: field.field,
          value: reportedValue(raw), message: `${field.field}: ${message}`,
          cell: cellReference((index ?? 0) + 1, row.row),
        });
      };
      const reading = readField(field, raw);
      let value: unknown;
      if ('error' in reading) {
        fail(reading.error);
        value = placeholder(field);
      } else if (reading.value === null) {
        if (field.required && index !== undefined) {
          fail('this column is required; the cell is blank');
        }
        value = placeholder(field);
      } else {
        value = reading.value;
      }
      if (field.kind === 'code' && field.required && value === null) {
        isIdentified = false;
      }
      record[field.property] = value;
    }
    const attributes = readAttributes(layout, row.cells, row.row, errors);
    if (!isIdentified) {
      continue;
    }
    record['row'] = row.row;
    if (attributes !== undefined) {
      record['attributes'] = attributes;
    }
    records.push(record);
  }
  return count;
}

function readField(field: TemplateField, raw: RawValue): CellReading<unknown> {
  switch (field.kind) {
    case 'code':
      return readCode(raw);
    case 'number':
      return readNumber(raw);
    case 'yesno':
      return readYesNo(raw);
    case 'text':
      return readText(raw);
  }
}

/** The value a blank (or unreadable) cell stands for. */
function placeholder(field: TemplateField): unknown {
  if (field.default !== undefined) {
    return field.default;
  }
  switch (field.kind) {
    case 'text':
      return '';
    case 'number':
      // A required number (weekly_revenue) has no default; 0 keeps the record usable.
      return field.required ? 0 : null;
    default:
      return null;
  }
}

function readAttributes(
  layout: SheetLayout,
  cells: readonly RawValue[],
  row: number,
  errors: WorkbookError[],
): Record<string, string> | undefined {
  let attributes: Record<string, string> | undefined;
  for (const extra of layout.extras) {
    const value = cells[extra.index] ?? null;
    if (isBlank(value)) {
      continue;
    }
    if (isFault(value)) {
      errors.push({
        sheet: layout.sheet.name, row, column: extra.header, value: value.fault,
        message: `${extra.header}: ${faultMessage(value.fault)}`,
        cell: cellReference(extra.index + 1, row),
      });
      continue;
    }
    attributes ??= {};
    attributes[extra.header] = displayText(value);
  }
  return attributes;
}
