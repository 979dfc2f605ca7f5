/**
 * Fixtures for the specs: a small supply network written by hand for these tests (two plants,
 * two products, a three-line BOM, three suppliers with one sub-tier purchase), its rows as a
 * template workbook would hold them, and helpers that build .xlsx, CSV and zip bytes in code,
 * so no binary fixture is committed.
 */
import type { SupplyModel } from '@keelson/contracts';
import ExcelJS from 'exceljs';
import { zipSync } from 'fflate';

/** A sheet's cells, row by row from row 1; `undefined` or null leaves a cell empty. */
export type SheetRows = ExcelJS.CellValue[][];

/** The small network's sheets, headers in row 1 as the template writes them. */
export function smallNetworkSheets(): Record<string, SheetRows> {
  return {
    Plants: [
      ['plant_code', 'plant_name', 'country'],
      ['P1', 'Augsburg', 'DE'],
      ['P2', 'Suzhou', 'CN'],
    ],
    Products: [
      ['product_code', 'plant_code', 'product_name', 'weekly_revenue'],
      ['F1', 'P1', 'Pump housing', 1000],
      ['F2', 'P2', 'Valve', 2500],
    ],
    BOM: [
      ['parent_code', 'child_code', 'qty_per'],
      ['F1', 'A', 2],
      ['A', 'C1', null],
      ['F2', 'B', 3],
    ],
    Suppliers: [
      ['supplier_code', 'supplier_name', 'country', 'region', 'recovery_weeks',
        'financial_health', 'delivery_score', 'has_continuity_plan'],
      ['S1', 'Müller Guss GmbH', 'DE', 'Bavaria', 12, 4, 5, 'yes'],
      ['S2', '苏州精密', 'CN', 'Jiangsu', null, null, 3, 'no'],
      ['S3', 'Raw Metals', 'PL', '', 6, 2, null, null],
    ],
    Sourcing: [
      ['buyer_code', 'item_code', 'supplier_code', 'share_pct', 'qualified'],
      ['P1', 'C1', 'S1', 60, 'yes'],
      ['P1', 'C1', 'S2', 40, 'no'],
      ['P2', 'B', 'S2', null, null],
      ['S1', 'R1', 'S3', 100, 'y'],
    ],
    Stock: [
      ['plant_code', 'item_code', 'weeks_of_cover'],
      ['P1', 'C1', 2.5],
    ],
  };
}

/** The model the small network's sheets must read to (worked out by hand from the rows). */
export function smallNetworkModel(): SupplyModel {
  return {
    plants: [
      { code: 'P1', name: 'Augsburg', country: 'DE', row: 2 },
      { code: 'P2', name: 'Suzhou', country: 'CN', row: 3 },
    ],
    products: [
      { code: 'F1', plantCode: 'P1', name: 'Pump housing', weeklyRevenue: 1000, row: 2 },
      { code: 'F2', plantCode: 'P2', name: 'Valve', weeklyRevenue: 2500, row: 3 },
    ],
    bom: [
      { parentCode: 'F1', childCode: 'A', qtyPer: 2, row: 2 },
      { parentCode: 'A', childCode: 'C1', qtyPer: 1, row: 3 },
      { parentCode: 'F2', childCode: 'B', qtyPer: 3, row: 4 },
    ],
    suppliers: [
      { code: 'S1', name: 'Müller Guss GmbH', country: 'DE', region: 'Bavaria', recoveryWeeks: 12,
        financialHealth: 4, deliveryScore: 5, hasContinuityPlan: true, row: 2 },
      { code: 'S2', name: '苏州精密', country: 'CN', region: 'Jiangsu', recoveryWeeks: 8,
        financialHealth: null, deliveryScore: 3, hasContinuityPlan: false, row: 3 },
      { code: 'S3', name: 'Raw Metals', country: 'PL', region: '', recoveryWeeks: 6,
        financialHealth: 2, deliveryScore: null, hasContinuityPlan: null, row: 4 },
    ],
    sourcing: [
      { buyerCode: 'P1', itemCode: 'C1', supplierCode: 'S1', sharePct: 60, isQualified: true,
        row: 2 },
      { buyerCode: 'P1', itemCode: 'C1', supplierCode: 'S2', sharePct: 40, isQualified: false,
        row: 3 },
      { buyerCode: 'P2', itemCode: 'B', supplierCode: 'S2', sharePct: null, isQualified: true,
        row: 4 },
      { buyerCode: 'S1', itemCode: 'R1', supplierCode: 'S3', sharePct: 100, isQualified: true,
        row: 5 },
    ],
    stock: [{ plantCode: 'P1', itemCode: 'C1', weeksOfCover: 2.5, row: 2 }],
  };
}

/** An .xlsx with the given sheets, in the given order. */
export async function buildXlsx(
  sheets: Record<string, SheetRows>,
  decorate?: (workbook: ExcelJS.Workbook) => void,
): Promise<Uint8Array> {
  const workbook = new ExcelJS.Workbook();
  for (const [name, rows] of Object.entries(sheets)) {
    const worksheet = workbook.addWorksheet(name);
    rows.forEach((cells, index) => {
      const row = worksheet.getRow(index + 1);
      cells.forEach((value, column) => {
        if (value !== undefined && value !== null) {
          row.getCell(column + 1).value = value;
        }
      });
    });
  }
  decorate?.(workbook);
  return new Uint8Array((await workbook.xlsx.writeBuffer()) as ArrayBuffer);
}

/** UTF-8 bytes of a text. */
export function utf8(text: string): Uint8Array {
  return new TextEncoder().encode(text);
}

/** A sheet's rows as CSV text (fields quoted when they need it), CRLF line ends. */
export function toCsv(rows: SheetRows): string {
  const quote = (value: ExcelJS.CellValue): string => {
    const text = value === null || value === undefined ? '' : String(value);
    return /[",\r\n]/u.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
  };
  return rows.map((cells) => cells.map(quote).join(',')).join('\r\n') + '\r\n';
}

/** A zip archive (deflated at `level`) of named files. */
export function buildZip(files: Record<string, Uint8Array>, level: 6 | 9 = 6): Uint8Array {
  return zipSync(files, { level });
}
