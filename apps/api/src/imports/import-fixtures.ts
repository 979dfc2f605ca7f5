/**
 * Fixtures of the import specs, built in code so no binary file is committed: the small
 * hand-made network and the .xlsx and zip builders of `@keelson/workbook/testing` (two plants,
 * two products, a three-line BOM, three suppliers with one sub-tier purchase, accented and CJK
 * names), a zip bomb, an upload helper, workbook downloads and the `network_*` row counts.
 */
import { crc32 } from 'node:zlib';
import { deflateSync } from 'fflate';
import request from 'supertest';
import type { TestApp } from '../testing/test-app';

export { buildXlsx, buildZip, smallNetworkSheets, type SheetRows } from '@keelson/workbook/testing';
export { bearer, downloadWorkbook } from '../testing/workbook-download';

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
