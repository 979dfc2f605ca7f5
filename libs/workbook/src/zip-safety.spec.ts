/**
 * Untrusted archives: truncated zips, zip bombs that declare their size honestly and ones that
 * lie about it, too many entries, and the worksheet row count checked before parsing. Archives
 * are built with fflate; header offsets follow PKWARE's APPNOTE 6.3.10 (sections 4.3.7, 4.3.12).
 */
import { describe, expect, it } from 'vitest';
import { buildXlsx, buildZip, smallNetworkSheets, utf8 } from './fixture-workbooks';
import { DEFAULT_WORKBOOK_LIMITS, resolveLimits } from './limits';
import { readWorkbook } from './read-workbook';
import { readZipDirectory } from './zip-directory';

/** Overwrites the declared uncompressed size of every entry (central and local headers). */
function declareSize(zip: Uint8Array, size: number): Uint8Array {
  const patched = zip.slice();
  const view = new DataView(patched.buffer);
  for (let at = 0; at + 4 <= patched.length; at += 1) {
    const signature = view.getUint32(at, true);
    if (signature === 0x02014b50) {
      view.setUint32(at + 24, size, true);
    } else if (signature === 0x04034b50) {
      view.setUint32(at + 22, size, true);
    }
  }
  return patched;
}

describe('zip archives from untrusted uploads', () => {
  it('refuses a truncated xlsx with a clear error', async () => {
    const xlsx = await buildXlsx(smallNetworkSheets());
    for (const cut of [0.3, 0.7, 0.99]) {
      const result = await readWorkbook(xlsx.subarray(0, Math.floor(xlsx.length * cut)));
      expect(result.model).toBeNull();
      expect(result.errors).toHaveLength(1);
      expect(result.errors[0]).toMatchObject({ sheet: null, row: null, column: null });
      expect(result.errors[0]?.message).toMatch(/truncated or corrupt/u);
    }
  });

  it('refuses a bomb whose declared size passes the default limit, before inflating', async () => {
    // 64 KB of zeros deflates to a few hundred bytes; the directory then declares 300 MB.
    const zip = declareSize(buildZip({ 'Plants.csv': new Uint8Array(64 * 1024) }), 300 * 2 ** 20);
    const result = await readWorkbook(zip);
    expect(result.errors).toHaveLength(1);
    expect(result.errors[0]?.message).toBe(
      'the archive would unpack to 314572800 bytes (300 MB); the limit is 209715200 bytes (200 MB)',
    );
  });

  it('refuses a real bomb over a lowered limit, naming the limit and the size', async () => {
    const zip = buildZip({ 'bomb.csv': new Uint8Array(8 * 2 ** 20) });
    expect(zip.length).toBeLessThan(20_000);
    const result = await readWorkbook(zip, { limits: { maxUncompressedBytes: 2 ** 20 } });
    expect(result.errors[0]?.message).toBe(
      'the archive would unpack to 8388608 bytes (8 MB); the limit is 1048576 bytes (1 MB)',
    );
  });

  it('stops inflating an entry that unpacks to more than it declares', async () => {
    const zip = declareSize(buildZip({ 'Plants.csv': new Uint8Array(4 * 2 ** 20) }), 1000);
    const result = await readWorkbook(zip);
    expect(result.errors[0]?.message).toBe(
      'the zip archive is corrupt or crafted: "Plants.csv" does not unpack to the 1000 bytes ' +
        'its directory declares',
    );
  });

  it('refuses an archive with more entries than allowed', async () => {
    const files: Record<string, Uint8Array> = {};
    for (let index = 0; index < 30; index += 1) {
      files[`sheet${index}.csv`] = utf8('a\n1\n');
    }
    const result = await readWorkbook(buildZip(files), { limits: { maxZipEntries: 20 } });
    expect(result.errors[0]?.message).toBe('the archive has 30 entries; the limit is 20 entries');
  });

  it('refuses a file over the byte limit before looking inside', async () => {
    const xlsx = await buildXlsx(smallNetworkSheets());
    const result = await readWorkbook(xlsx, { limits: { maxBytes: 1000 } });
    expect(result.errors[0]?.message).toBe(
      `the file is ${xlsx.length} bytes (${Number((xlsx.length / 1024).toFixed(1))} KB); ` +
        'the limit is 1000 bytes (1000 bytes)',
    );
  });

  it('refuses an empty archive and one without workbook or CSV files', async () => {
    expect((await readWorkbook(buildZip({}))).errors[0]?.message).toBe('the zip archive is empty');
    const other = await readWorkbook(buildZip({ 'notes.txt': utf8('hello') }));
    expect(other.format).toBe('zip');
    expect(other.errors[0]?.message).toBe(
      'the zip archive holds neither an .xlsx workbook nor .csv files',
    );
  });

  it('counts worksheet rows before the parser builds them', async () => {
    const rows = [['plant_code'], ...Array.from({ length: 40 }, (_, index) => [`P${index}`])];
    const xlsx = await buildXlsx({ ...smallNetworkSheets(), Plants: rows });
    const result = await readWorkbook(xlsx, { limits: { maxRows: 30 } });
    expect(result.model).toBeNull();
    expect(result.errors).toEqual([{ sheet: null, row: null, column: null, value: null,
      message: 'the file has more than 30 rows; the limit is 30' }]);
  });
});

describe('readZipDirectory', () => {
  it('lists the entries with their declared sizes', () => {
    const zip = buildZip({ 'a.csv': utf8('x,y\n'), 'dir/b.csv': new Uint8Array(5000) });
    const directory = readZipDirectory(zip, resolveLimits(undefined));
    expect(directory).toHaveProperty('entries');
    const entries = 'entries' in directory ? directory.entries : [];
    expect(entries.map((entry) => [entry.name, entry.uncompressedSize])).toEqual([
      ['a.csv', 4],
      ['dir/b.csv', 5000],
    ]);
  });

  it('finds no directory in bytes that only start like a zip', () => {
    const directory = readZipDirectory(new Uint8Array([0x50, 0x4b, 3, 4, 0, 0]),
      { ...DEFAULT_WORKBOOK_LIMITS });
    expect(directory).toEqual({
      error: 'the zip archive is truncated or corrupt: its directory (end record) was not found',
    });
  });
});

describe('damaged workbooks', () => {
  it('never throws on randomly damaged copies of a valid workbook', async () => {
    const xlsx = await buildXlsx(smallNetworkSheets());
    // Seeded 32-bit linear congruential generator (Numerical Recipes constants).
    let state = 20240601;
    const next = () => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0);
    for (let trial = 0; trial < 80; trial += 1) {
      const damaged = xlsx.slice();
      for (let flip = 0; flip <= next() % 4; flip += 1) {
        damaged[next() % damaged.length] = next() & 0xff;
      }
      const result = await readWorkbook(damaged);
      // Either a model with no errors, or no model with at least one located error.
      expect(result.model === null).toBe(result.errors.length > 0);
    }
  });
});
