/**
 * Other header and sheet names buyers commonly use, for the import screen's suggestions only.
 * The reader itself matches exact names (by key) or an explicit mapping; a suggestion becomes
 * a mapping only once the buyer confirms it. Keys are compared as by `nameKey`.
 */
import type { SheetName } from '@keelson/contracts';

/** Alternative header keys per template field (the field's own name always matches). */
export const FIELD_ALIASES: Record<string, readonly string[]> = {
  plant_code: ['plant', 'plantid', 'site', 'sitecode', 'siteid'],
  plant_name: ['plantname', 'sitename', 'name'],
  product_code: ['product', 'productid', 'sku', 'finishedgood'],
  product_name: ['productname', 'description', 'name'],
  weekly_revenue: ['revenueperweek', 'weeklysales', 'revenue'],
  parent_code: ['parent', 'parentpart', 'assembly'],
  child_code: ['child', 'component', 'componentcode'],
  qty_per: ['qty', 'quantity', 'quantityper', 'usage'],
  supplier_code: ['supplier', 'vendor', 'vendorcode', 'supplierid', 'vendorid', 'vendorno',
    'vendornumber', 'supplierno', 'suppliernumber'],
  supplier_name: ['vendorname', 'name'],
  region: ['state', 'province'],
  recovery_weeks: ['ttr', 'timetorecover', 'recoverytime', 'timetorecoverweeks'],
  financial_health: ['financialscore', 'financial', 'financialrating'],
  delivery_score: ['otd', 'deliveryperformance', 'deliveryrating'],
  has_continuity_plan: ['continuityplan', 'bcp', 'hasbcp'],
  buyer_code: ['buyer', 'buyingsite'],
  item_code: ['item', 'part', 'partcode', 'partnumber', 'material'],
  share_pct: ['share', 'sharepercent', 'allocation'],
  qualified: ['isqualified', 'approved'],
  weeks_of_cover: ['cover', 'weekscover', 'coverweeks', 'stockweeks'],
};

/** Alternative sheet keys per template sheet. */
export const SHEET_ALIASES: Record<SheetName, readonly string[]> = {
  Plants: ['sites', 'plant', 'site'],
  Products: ['product', 'finishedgoods'],
  BOM: ['billofmaterials', 'bill', 'boms'],
  Suppliers: ['supplier', 'vendors', 'vendor'],
  Sourcing: ['purchasing', 'sources', 'supply'],
  Stock: ['inventory', 'stocks'],
};
