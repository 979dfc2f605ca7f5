/**
 * Every kind of bad upload: each is recorded as a batch with a clear, located message, and none
 * writes a single `network_*` row.
 */
import { unzipSync } from 'fflate';
import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { ImportBatchDto, ImportProblemDto, SupplyModel } from '@keelson/contracts';
import { readWorkbook, writeWorkbook } from '@keelson/workbook';
import { readNetworkModel } from '../network/network-store';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  bearer,
  buildXlsx,
  networkRowCounts,
  smallNetworkSheets,
  upload,
  zipBomb,
  type SheetRows,
} from './import-fixtures';
import { createImportServices } from './imports.module';

let t: TestApp;
let countsBefore: Record<string, number>;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());
beforeEach(() => {
  countsBefore = networkRowCounts(t);
});

const api = () => request(t.app);

async function problemsOf(batchId: number): Promise<ImportProblemDto[]> {
  const response = await api().get(`/api/imports/${batchId}/problems?kind=error&limit=1000`)
    .set(bearer(t));
  expect(response.status).toBe(200);
  return response.body.items;
}

/** Uploads, expects the status, and checks that nothing reached the network tables. */
async function uploadExpecting(data: Uint8Array, fileName: string, status: string) {
  const response = await upload(t, data, fileName);
  expect(response.status).toBe(201);
  const batch = response.body as ImportBatchDto;
  expect(batch.status).toBe(status);
  expect(networkRowCounts(t)).toEqual(countsBefore);
  return { batch, problems: await problemsOf(batch.id) };
}

function withSheets(change: (sheets: Record<string, SheetRows>) => void) {
  const sheets = smallNetworkSheets();
  change(sheets);
  return buildXlsx(sheets);
}

describe('bad uploads', () => {
  it('rejects a PNG renamed .xlsx by its content, with format null', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
    const { batch, problems } = await uploadExpecting(png, 'suppliers.xlsx', 'rejected');
    expect(batch.format).toBeNull();
    expect(problems.map((p) => p.message)).toEqual(['not a spreadsheet: the file is a PNG image']);
    const automation = await upload(t, png, 'suppliers.xlsx', { query: 'commit=true' });
    expect(automation.status).toBe(422);
    expect(automation.body.error.details[0].message).toContain('PNG image');
  });

  it('rejects a truncated zip', async () => {
    const good = await buildXlsx(smallNetworkSheets());
    const { problems } = await uploadExpecting(good.slice(0, Math.floor(good.length / 2)),
      'cut.xlsx', 'rejected');
    expect(problems[0]!.message).toMatch(/truncated or corrupt/);
  });

  it('rejects an empty workbook, saying it is empty', async () => {
    const { problems } = await uploadExpecting(await buildXlsx({ Sheet1: [] }), 'empty.xlsx',
      'rejected');
    expect(problems.map((p) => p.message)).toEqual(
      ['the workbook is empty: no cell of "Sheet1" holds a value']);
  });

  it('rejects a workbook over the row limit (a small limit set on the service)', async () => {
    const { imports } = createImportServices(t.database.db, { limits: { maxRows: 10 } });
    const buyer = { id: t.userId('buyer@demo.test'), email: 'buyer@demo.test', name: 'Bruno',
      role: 'buyer' as const, plantCodes: [] };
    const data = await buildXlsx(smallNetworkSheets());
    const { batch } = await imports.upload(buyer, { fileName: 'many.xlsx', data });
    expect(batch.status).toBe('rejected');
    expect(networkRowCounts(t)).toEqual(countsBefore);
    expect((await problemsOf(batch.id))[0]!.message)
      .toBe('the file has more than 10 rows; the limit is 10');
    await expect(imports.uploadAndCommit(buyer, { fileName: 'many.xlsx', data }))
      .rejects.toMatchObject({ status: 422, code: 'invalid_workbook' });
    expect(networkRowCounts(t)).toEqual(countsBefore);
  });

  it('rejects a zip bomb (under 300 KB that would inflate to 210 MB) before inflating it',
    async () => {
      // The builder makes real archives: a small one unpacks to what it claims.
      const small = unzipSync(zipBomb(3, 5000));
      expect(Object.values(small).map((entry) => entry.length)).toEqual([5000, 5000, 5000]);
      const bomb = zipBomb(210, 1024 * 1024);
      expect(bomb.length).toBeLessThan(300 * 1024);
      const { problems } = await uploadExpecting(bomb, 'bomb.zip', 'rejected');
      expect(problems[0]!.message).toMatch(/would unpack to .*the limit is .*\(200 MB\)/);
    });

  it('finds a header row in row 3 after two title rows; with {headerRow: 3} it commits',
    async () => {
      const sheets = smallNetworkSheets();
      for (const name of Object.keys(sheets)) {
        sheets[name] = [[`Tarnwell export: ${name}`], ['as of 2026-03-01'], ...sheets[name]!];
      }
      const { batch, problems } = await uploadExpecting(await buildXlsx(sheets), 'titled.xlsx',
        'needs_mapping');
      expect(problems[0]!.message).toContain('(headers are read from row 1)');
      const inspection = await api().get(`/api/imports/${batch.id}/inspection`).set(bearer(t));
      expect(inspection.status).toBe(200);
      expect(inspection.body.sheets.map((s: { headerRow: number }) => s.headerRow))
        .toEqual([3, 3, 3, 3, 3, 3]);
      expect(inspection.body.suggestions.Suppliers.headerRow).toBe(3);
      const mapping = Object.fromEntries(Object.keys(sheets).map((name) => [name,
        { headerRow: 3 }]));
      const checked = await api().post(`/api/imports/${batch.id}/check`).set(bearer(t))
        .send({ mapping });
      expect(checked.body).toMatchObject({ status: 'ready', errorCount: 0, mapping });
      const committed = await api().post(`/api/imports/${batch.id}/commit`).set(bearer(t));
      expect(committed.status).toBe(201);
      expect(committed.body.counts.Suppliers).toBe(3);
    });

  it.each([
    ['duplicate supplier codes', (s: Record<string, SheetRows>) => {
      s.Suppliers!.push(['S2', 'Another', 'CN', 'Jiangsu', 5, 3, 3, 'no']);
    }, { sheet: 'Suppliers', row: 5, column: 'supplier_code', cell: 'A5', value: 'S2',
      message: 'duplicate: supplier_code "S2" already appears in row 3' }],
    ['a Sourcing row naming an unknown supplier', (s: Record<string, SheetRows>) => {
      s.Sourcing!.push(['P1', 'C1', 'S404', 10, 'yes']);
    }, { sheet: 'Sourcing', row: 6, column: 'supplier_code', cell: 'C6', value: 'S404',
      message: 'supplier_code "S404" is not a supplier of the Suppliers sheet' }],
    ['text in weekly_revenue', (s: Record<string, SheetRows>) => {
      s.Products![2]![3] = 'about 2k';
    }, { sheet: 'Products', row: 3, column: 'weekly_revenue', cell: 'D3', value: 'about 2k',
      message: 'weekly_revenue: expected a number; got "about 2k"' }],
    ['a formula whose cached value is #REF!', (s: Record<string, SheetRows>) => {
      s.Products![1]![3] = { formula: 'Prices!B7*4', result: { error: '#REF!' } };
    }, { sheet: 'Products', row: 2, column: 'weekly_revenue', cell: 'D2', value: '#REF!',
      message: 'weekly_revenue: the cell holds the error value #REF!' }],
  ] as const)('rejects %s with the cell named', async (_name, change, expected) => {
    const { problems } = await uploadExpecting(await withSheets(change), 'bad.xlsx', 'rejected');
    expect(problems).toEqual([{ kind: 'error', ...expected }]);
  });

  it('rejects a BOM cycle, naming the loop', async () => {
    const data = await withSheets((s) => {
      s.BOM!.push(['B', 'F2', 1]);
    });
    const { problems } = await uploadExpecting(data, 'cycle.xlsx', 'rejected');
    expect(problems.some((p) => p.sheet === 'BOM' && /^BOM cycle: /.test(p.message))).toBe(true);
  });
});

describe('non-ASCII names', () => {
  it('keep accents and CJK through import, the stored version and a written workbook',
    async () => {
      const data = await withSheets((s) => {
        s.Suppliers![0]!.push('Ansprechpartner 担当');
        s.Suppliers![1]!.push('Jürgen Weiß');
        s.Plants![1]![1] = 'Łódź Zakład';
        s.Products![2]![2] = 'バルブ «Größe 2»';
      });
      const response = await upload(t, data, '供应商 Übersicht.xlsx', { query: 'commit=true' });
      expect(response.status).toBe(201);
      const model = readNetworkModel(t.database.db, response.body.networkVersionId)!;
      const expectNames = (m: SupplyModel) => {
        expect(m.suppliers.map((s) => s.name)).toEqual(['Müller Guss GmbH', '苏州精密',
          'Raw Metals']);
        expect(m.suppliers[0]!.attributes).toEqual({ 'Ansprechpartner 担当': 'Jürgen Weiß' });
        expect(m.plants[0]!.name).toBe('Łódź Zakład');
        expect(m.products[1]!.name).toBe('バルブ «Größe 2»');
      };
      expectNames(model);
      const reread = await readWorkbook(await writeWorkbook(model));
      expect(reread.errors).toEqual([]);
      expectNames(reread.model!);
      const batch = await api().get(`/api/imports/${response.body.id}`).set(bearer(t));
      expect(batch.body.fileName).toBe('供应商 Übersicht.xlsx');
    });
});
