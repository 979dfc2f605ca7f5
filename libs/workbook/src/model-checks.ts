/**
 * The rules of a supply model that span rows (spec 8.4, 8.7, 8.8, 8.9): value ranges, duplicate
 * keys, one kind per code, references between sheets, and items both made and bought at a plant.
 * Every check runs on the typed model, so models built in code are checked the same way as
 * uploaded files.
 */
import type { SheetName, SupplyModel, WorkbookError } from '@keelson/contracts';
import type { MakeError } from './problem-locator';
import { TEMPLATE_FIELDS, type TemplateField } from './template-fields';

/** A record of any sheet, seen through its template properties. */
type AnyRecord = { row?: number } & Record<string, unknown>;

/** The model's records per template sheet, in workbook order. */
export function recordsBySheet(model: SupplyModel): [SheetName, AnyRecord[]][] {
  return [
    ['Plants', model.plants], ['Products', model.products], ['BOM', model.bom],
    ['Suppliers', model.suppliers], ['Sourcing', model.sourcing], ['Stock', model.stock],
  ] as unknown as [SheetName, AnyRecord[]][];
}

/** Types, blank codes and ranges of every field (spec 8.4). */
export function checkValues(model: SupplyModel, makeError: MakeError): WorkbookError[] {
  const errors: WorkbookError[] = [];
  for (const [sheet, records] of recordsBySheet(model)) {
    for (const record of records) {
      for (const field of TEMPLATE_FIELDS[sheet]) {
        const problem = valueProblem(field, record[field.property]);
        if (problem !== null) {
          const value = record[field.property];
          const reported = typeof value === 'object' || value === undefined ? null : value;
          errors.push(makeError(sheet, record.row, field.field, reported as WorkbookError['value'],
            `${field.field}: ${problem}`));
        }
      }
    }
  }
  return errors;
}

function valueProblem(field: TemplateField, value: unknown): string | null {
  const isNullable = !field.required && field.default === undefined;
  if (value === null && isNullable && field.kind !== 'text') {
    return null;
  }
  switch (field.kind) {
    case 'code':
      return typeof value === 'string' && value.trim() !== '' ? null : 'a code must not be blank';
    case 'text':
      return typeof value === 'string' ? null : 'expected text';
    case 'yesno':
      return typeof value === 'boolean' ? null : 'expected yes or no';
    case 'number':
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        return 'expected a finite number';
      }
      return rangeProblem(field, value);
  }
}

function rangeProblem(field: TemplateField, value: number): string | null {
  const range = field.range;
  if (range === undefined) {
    return null;
  }
  const isBelow = range.min !== undefined &&
    (range.isMinExclusive === true ? value <= range.min : value < range.min);
  const isAbove = range.max !== undefined && value > range.max;
  if (!isBelow && !isAbove) {
    return null;
  }
  if (range.max !== undefined) {
    return `must be from ${range.min} to ${range.max}; got ${value}`;
  }
  return range.isMinExclusive === true
    ? `must be more than ${range.min}; got ${value}`
    : `must be ${range.min} or more; got ${value}`;
}

/** The key fields of each sheet (spec 8.7); a repeated key is an error at the later row. */
const KEYS: Record<SheetName, string[]> = {
  Plants: ['plant_code'],
  Products: ['product_code'],
  BOM: ['parent_code', 'child_code'],
  Suppliers: ['supplier_code'],
  Sourcing: ['buyer_code', 'item_code', 'supplier_code'],
  Stock: ['plant_code', 'item_code'],
};

/** Repeated keys in every sheet (spec 8.7). */
export function checkDuplicates(model: SupplyModel, makeError: MakeError): WorkbookError[] {
  const errors: WorkbookError[] = [];
  for (const [sheet, records] of recordsBySheet(model)) {
    const fields = KEYS[sheet].map((name) => TEMPLATE_FIELDS[sheet].find((f) => f.field === name));
    const properties = fields.map((field) => field?.property ?? '');
    const seen = new Map<string, AnyRecord>();
    for (const record of records) {
      const parts = properties.map((property) => String(record[property]));
      // Codes never hold NUL (cells are text), so it separates the parts safely.
      const key = parts.join('\u0000');
      const first = seen.get(key);
      if (first === undefined) {
        seen.set(key, record);
        continue;
      }
      const column = KEYS[sheet][KEYS[sheet].length - 1] as string;
      const named = KEYS[sheet].map((name, index) => `${name} "${parts[index]}"`).join(', ');
      const where = first.row === undefined ? 'an earlier row' : `row ${first.row}`;
      errors.push(makeError(sheet, record.row, column, parts[parts.length - 1] ?? null,
        `duplicate: ${named} already appears in ${where}`));
    }
  }
  return errors;
}

/** The codes the model defines: plants, products and suppliers, first definition kept. */
export interface ModelCodes {
  plants: Map<string, number | undefined>;
  products: Map<string, number | undefined>;
  suppliers: Map<string, number | undefined>;
}

/** The defined codes of a model. */
export function collectCodes(model: SupplyModel): ModelCodes {
  const gather = (records: readonly { code: string; row?: number }[]) => {
    const codes = new Map<string, number | undefined>();
    for (const record of records) {
      if (!codes.has(record.code)) {
        codes.set(record.code, record.row);
      }
    }
    return codes;
  };
  return {
    plants: gather(model.plants),
    products: gather(model.products),
    suppliers: gather(model.suppliers),
  };
}

/** Sheets whose codes are not fully known (missing, or a key column absent). */
export type IncompleteSheets = ReadonlySet<SheetName>;
