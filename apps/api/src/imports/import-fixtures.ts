/**
 * Fixtures of the import specs, built in code so no binary file is committed: a small network
 * written by hand for these tests (the same shape as libs/workbook's own spec fixture: two
 * plants, two products, a three-line BOM, three suppliers with one sub-tier purchase, accented
 * and CJK names), .xlsx and zip builders, an upload helper and the `network_*` row counts.
 */
import { crc32 } from 'node:zlib';
import ExcelJS from 'exceljs';
import { deflateSync, zipSync } from 'fflate';
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

/**
 * A zip bomb: `count` entries that each inflate to `entryBytes` zeros, deflated once and the
 * compressed bytes repeated, so building it costs milliseconds. The archive is well formed
 * (sizes and CRC-32 are true), it is only far larger once unpacked than on disk.
 */
export function zipBomb(count: number, entryBytes: number): Uint8Array {
  const content = new Uint8Array(entryBytes);
  const packed = deflateSync(content, { level: 9 });
  const checksum = crc32(content);
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (let index = 0; index < count; index += 1) {
    const name = Buffer.from(`part-${index}.csv`);
    const fields = (header: Buffer, at: number) => {
      header.writeUInt16LE(20, at); // version needed
      header.writeUInt16LE(0, at + 2); // flags
      header.writeUInt16LE(8, at + 4); // deflate
      header.writeUInt32LE(0, at + 6); // time and date
      header.writeUInt32LE(checksum, at + 10);
      header.writeUInt32LE(packed.length, at + 14);
      header.writeUInt32LE(entryBytes, at + 18);
      header.writeUInt16LE(name.length, at + 22);
    };
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    fields(local, 4);
    locals.push(local, name, Buffer.from(packed));
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4); // version made by
    fields(central, 6);
    central.writeUInt32LE(offset, 42);
    centrals.push(central, name);
    offset += local.length + name.length + packed.length;
  }
  const directory = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(count, 8);
  end.writeUInt16LE(count, 10);
  end.writeUInt32LE(directory.length, 12);
  end.writeUInt32LE(offset, 16);
  return new Uint8Array(Buffer.concat([...locals, directory, end]));
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
export function upload(
  t: TestApp,
  data: Uint8Array,
  fileName: string,
  options: UploadOptions = {},
) {
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

/** GETs an .xlsx download and opens it; returns the response and the workbook. */
export async function downloadWorkbook(t: TestApp, path: string, email = 'buyer@demo.test') {
  const response = await request(t.app).get(path).set(bearer(t, email)).buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
  const workbook = new ExcelJS.Workbook();
  if (response.status === 200) {
    const bytes = response.body as Buffer;
    await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
      bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  }
  return { response, workbook };
}

/** A Bearer header of a demo account. */
export function bearer(t: TestApp, email = 'buyer@demo.test'): Record<string, string> {
  return { Authorization: `Bearer ${t.tokenFor(email)}` };
}
