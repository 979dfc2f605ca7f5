/**
 * The typed supply model: what a template workbook holds once parsed and validated
 * (spec section 1). `libs/workbook` produces it, `libs/supply-graph` consumes it, the
 * API stores it per network version. Codes are trimmed, case-sensitive strings.
 *
 * `row` is the spreadsheet's own 1-based row number of the record (absent for models
 * built in code). `attributes` keeps extra columns by their header text.
 */

/** Extra, unrecognised columns of a row, keyed by the header as written. */
export type Attributes = Record<string, string>;

/** A manufacturing site (sheet Plants). */
export interface Plant {
  code: string;
  name: string;
  country: string;
  row?: number;
  attributes?: Attributes;
}

/** A finished good made at a plant (sheet Products). */
export interface Product {
  code: string;
  plantCode: string;
  name: string;
  /** Revenue per week in the workspace currency. */
  weeklyRevenue: number;
  row?: number;
  attributes?: Attributes;
}

/** A bill-of-materials line: parent (a product or an item) needs child (an item). */
export interface BomLine {
  parentCode: string;
  childCode: string;
  /** Quantity of child per parent; defaults to 1. */
  qtyPer: number;
  row?: number;
  attributes?: Attributes;
}

/** A supplier site (sheet Suppliers). */
export interface Supplier {
  code: string;
  name: string;
  country: string;
  region: string;
  /** Time to recover after a disruption, in weeks; defaults to 8. */
  recoveryWeeks: number;
  /** 1 (poor) to 5 (strong); null when not given. */
  financialHealth: number | null;
  /** 1 (poor) to 5 (strong); null when not given. */
  deliveryScore: number | null;
  /** null when not given. */
  hasContinuityPlan: boolean | null;
  row?: number;
  attributes?: Attributes;
}

/** Buyer (a plant or a supplier) buys item from supplier (sheet Sourcing). */
export interface SourcingRow {
  buyerCode: string;
  itemCode: string;
  supplierCode: string;
  /** 0-100, informative only; null when not given. */
  sharePct: number | null;
  /** Defaults to true; unqualified rows are kept but are not a source. */
  isQualified: boolean;
  row?: number;
  attributes?: Attributes;
}

/** Inventory of an item at a plant, in weeks of demand (sheet Stock). */
export interface StockRow {
  plantCode: string;
  itemCode: string;
  /** Defaults to 0. */
  weeksOfCover: number;
  row?: number;
  attributes?: Attributes;
}

/** A whole network: the six sheets of the template, in workbook order. */
export interface SupplyModel {
  plants: Plant[];
  products: Product[];
  bom: BomLine[];
  suppliers: Supplier[];
  sourcing: SourcingRow[];
  stock: StockRow[];
}

/** The template's sheet names, in workbook order. */
export const SHEET_NAMES = ['Plants', 'Products', 'BOM', 'Suppliers', 'Sourcing', 'Stock'] as const;
/** One of the template's sheet names. */
export type SheetName = (typeof SHEET_NAMES)[number];

/** A located problem that blocks an import (spec 8.17). `column` is the snake_case field. */
export interface WorkbookError {
  sheet: string | null;
  row: number | null;
  column: string | null;
  value: string | number | boolean | null;
  message: string;
  /** A cell reference such as "D7", when there is one. */
  cell?: string;
}

/** Kinds of warning (spec 8.16). */
export type WorkbookWarningKind = 'product-no-bom' | 'supplier-unused' | 'unsourced';

/** A located problem that does not block an import (spec 8.16). */
export interface WorkbookWarning {
  sheet: string;
  row: number | null;
  kind: WorkbookWarningKind;
  message: string;
}
