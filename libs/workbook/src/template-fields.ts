/**
 * The template's columns, one table per sheet (spec section 1). The reader, the writer, the
 * template's "Read me" sheet and the import screen's mapping step all read this one table, so a
 * column is described, parsed and range-checked from the same entry.
 */
import { SHEET_NAMES, type SheetName } from '@keelson/contracts';

/** How a column's cells are read: a code (8.6), free text, a number (8.3) or yes/no (8.5). */
export type FieldKind = 'code' | 'text' | 'number' | 'yesno';

/** Allowed range of a number column (spec 8.4); bounds are inclusive unless marked exclusive. */
export interface FieldRange {
  min?: number;
  max?: number;
  isMinExclusive?: boolean;
}

/** One column of a template sheet. */
export interface TemplateField {
  /** The header as the template writes it, snake_case (also the `column` of an error). */
  field: string;
  /** The property of the typed record that holds the value. */
  property: string;
  required: boolean;
  kind: FieldKind;
  /** The value a blank cell stands for; absent when blank means "not given" (null or ""). */
  default?: number | boolean;
  range?: FieldRange;
  /** One or two plain sentences for buyers, shown in the template's "Read me" sheet. */
  help: string;
}

/** Every column of every template sheet, in the template's column order. */
export const TEMPLATE_FIELDS: Record<SheetName, readonly TemplateField[]> = {
  Plants: [
    { field: 'plant_code', property: 'code', required: true, kind: 'code',
      help: 'Your code for the manufacturing site, unique in this sheet.' },
    { field: 'plant_name', property: 'name', required: false, kind: 'text',
      help: 'The site name as people know it.' },
    { field: 'country', property: 'country', required: false, kind: 'text',
      help: 'Country of the site (ISO code or name).' },
  ],
  Products: [
    { field: 'product_code', property: 'code', required: true, kind: 'code',
      help: 'Code of the finished good, unique in this sheet.' },
    { field: 'plant_code', property: 'plantCode', required: true, kind: 'code',
      help: 'The plant that makes it; must be a plant_code of the Plants sheet.' },
    { field: 'product_name', property: 'name', required: false, kind: 'text',
      help: 'The product name.' },
    { field: 'weekly_revenue', property: 'weeklyRevenue', required: true, kind: 'number',
      range: { min: 0 },
      help: 'Revenue per week in the workspace currency; 0 or more. Must not be blank.' },
  ],
  BOM: [
    { field: 'parent_code', property: 'parentCode', required: true, kind: 'code',
      help: 'A product code or an item code that needs the child.' },
    { field: 'child_code', property: 'childCode', required: true, kind: 'code',
      help: 'The item needed; never a plant, product or supplier code.' },
    { field: 'qty_per', property: 'qtyPer', required: false, kind: 'number', default: 1,
      range: { min: 0, isMinExclusive: true },
      help: 'Quantity of the child per parent; more than 0. Blank means 1.' },
  ],
  Suppliers: [
    { field: 'supplier_code', property: 'code', required: true, kind: 'code',
      help: 'Code of the supplier site, unique in this sheet.' },
    { field: 'supplier_name', property: 'name', required: false, kind: 'text',
      help: 'The supplier name.' },
    { field: 'country', property: 'country', required: false, kind: 'text',
      help: 'Country of the supplier site.' },
    { field: 'region', property: 'region', required: false, kind: 'text',
      help: 'Region of the supplier site (for example a province or state).' },
    { field: 'recovery_weeks', property: 'recoveryWeeks', required: false, kind: 'number',
      default: 8, range: { min: 0 },
      help: 'Time to recover after a disruption, in weeks; 0 or more. Blank means 8.' },
    { field: 'financial_health', property: 'financialHealth', required: false, kind: 'number',
      range: { min: 1, max: 5 },
      help: '1 (poor) to 5 (strong). Blank means not known.' },
    { field: 'delivery_score', property: 'deliveryScore', required: false, kind: 'number',
      range: { min: 1, max: 5 },
      help: '1 (poor) to 5 (strong). Blank means not known.' },
    { field: 'has_continuity_plan', property: 'hasContinuityPlan', required: false,
      kind: 'yesno',
      help: 'Whether the supplier has a business continuity plan: yes or no. Blank: not known.' },
  ],
  Sourcing: [
    { field: 'buyer_code', property: 'buyerCode', required: true, kind: 'code',
      help: 'Who buys: a plant_code, or a supplier_code for a sub-tier purchase.' },
    { field: 'item_code', property: 'itemCode', required: true, kind: 'code',
      help: 'The item bought; never a plant, product or supplier code.' },
    { field: 'supplier_code', property: 'supplierCode', required: true, kind: 'code',
      help: 'Who sells it; must be a supplier_code of the Suppliers sheet.' },
    { field: 'share_pct', property: 'sharePct', required: false, kind: 'number',
      range: { min: 0, max: 100 },
      help: 'Share of the volume from this supplier, 0 to 100; for information only.' },
    { field: 'qualified', property: 'isQualified', required: false, kind: 'yesno',
      default: true,
      help: 'Whether this source is qualified: yes or no. Blank means yes. '
        + 'Unqualified rows are kept but do not count as a source.' },
  ],
  Stock: [
    { field: 'plant_code', property: 'plantCode', required: true, kind: 'code',
      help: 'The plant holding the stock; must be a plant_code of the Plants sheet.' },
    { field: 'item_code', property: 'itemCode', required: true, kind: 'code',
      help: 'The item in stock.' },
    { field: 'weeks_of_cover', property: 'weeksOfCover', required: false, kind: 'number',
      default: 0, range: { min: 0 },
      help: 'Stock on hand in weeks of demand; 0 or more. Blank means 0.' },
  ],
};

/** The sheets a workbook must have (spec 8.1); Stock may be left out. */
export const REQUIRED_SHEETS: readonly SheetName[] = SHEET_NAMES.filter(
  (sheet) => sheet !== 'Stock',
);

/** What each template sheet holds, for the "Read me" sheet and the import screen. */
export const SHEET_HELP: Record<SheetName, string> = {
  Plants: 'One row per manufacturing site.',
  Products: 'One row per finished good, with the plant that makes it and its weekly revenue.',
  BOM: 'Bill of materials: one row per parent and child. The same structure applies at '
    + 'every plant.',
  Suppliers: 'One row per supplier site.',
  Sourcing: 'Who buys which item from which supplier. Several rows for the same buyer and '
    + 'item are alternative sources.',
  Stock: 'Optional. Inventory of an item at a plant, in weeks of demand.',
};

