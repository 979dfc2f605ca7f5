/**
 * Fixtures of the import specs, built in code so no binary file is committed: a small network
 * written by hand for these tests (the same shape as libs/workbook's own spec fixture: two
 * plants, two products, a three-line BOM, three suppliers with one sub-tier purchase, accented
 * and CJK names), .xlsx and zip builders, an upload helper and the `network_*` row counts.
 */
import ExcelJS from 'exceljs';
import { zipSync } from 'fflate';
import request from 'supertest';
import type { TestApp } from '../testing/test-app';

/** A sheet's cells, row by row from row 1; null leaves a cell empty. */
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

/** An .xlsx with the given sheets, in the given order. */
export async function buildXlsx(sheets: Record<string, SheetRows>): Promise<Uint8Array> {
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
  return new Uint8Array((await workbook.xlsx.writeBuffer()) as ArrayBuffer);
}

/** A zip archive (deflated) of named files. */
export function buildZip(files: Record<string, Uint8Array>, level: 6 | 9 = 6): Uint8Array {
  return zipSync(files, { level });
}

/** The tables a commit writes, with their row counts. */
export const NETWORK_TABLES = [
  'network_versions', 'network_plants', 'network_products', 'network_items',
  'network_bom_lines', 'network_suppliers', 'network_supplier_plants', 'network_sourcing',
  'network_stock',
] as const;

/** Row counts of every `network_*` table. */
export function networkRowCounts(t: TestApp): Record<string, number> {
  return Object.fromEntries(NETWORK_TABLES.map((table) => [table,
    (t.database.sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n]));
}

/** Options of {@link upload}. */
export interface UploadOptions {
  /** Sent as `Authorization: Bearer` for this account unless `cookie` is given. */
  as?: string;
  cookie?: Record<string, string>;
  query?: string;
  fields?: Record<string, string>;
}

/** POSTs a file to /api/imports as multipart. */
export function upload(t: TestApp, data: Uint8Array, fileName: string, options: UploadOptions = {}) {
  const path = `/api/imports${options.query ? `?${options.query}` : ''}`;
  let call = request(t.app).post(path);
  if (options.cookie) {
    call = call.set(options.cookie);
  } else {
    call = call.set('Authorization', `Bearer ${t.tokenFor(options.as ?? 'buyer@demo.test')}`);
  }
  for (const [name, value] of Object.entries(options.fields ?? {})) {
    call = call.field(name, value);
  }
  return call.attach('file', Buffer.from(data), fileName);
}

/** A Bearer header of a demo account. */
export function bearer(t: TestApp, email = 'buyer@demo.test'): Record<string, string> {
  return { Authorization: `Bearer ${t.tokenFor(email)}` };
}
