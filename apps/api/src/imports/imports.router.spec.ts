import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ImportBatchDto, ImportCommitDto, Role } from '@keelson/contracts';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import {
  bearer,
  buildXlsx,
  downloadWorkbook,
  networkRowCounts,
  smallNetworkSheets,
  upload,
} from './import-fixtures';

let t: TestApp;
let good: Uint8Array;

beforeAll(async () => {
  t = await createTestApp({ uploadMaxBytes: 64 * 1024 });
  good = await buildXlsx(smallNetworkSheets());
});
afterAll(() => t.close());

const api = () => request(t.app);

describe('POST /api/imports?commit=true (automation)', () => {
  it('checks and commits a good file in one call: 201 with the version, counts and warnings',
    async () => {
      const response = await upload(t, good, 'plant-north.xlsx', { query: 'commit=true' });
      expect(response.status).toBe(201);
      const body = response.body as ImportCommitDto;
      expect(body.networkVersionId).toBeGreaterThan(0);
      expect(body.counts).toEqual({ Plants: 2, Products: 2, BOM: 3, Suppliers: 3, Sourcing: 4,
        Stock: 1 });
      expect(Array.isArray(body.warnings)).toBe(true);
      expect(body.changes.previousVersionId).toBeNull();
      expect(body.changes.suppliersAdded).toEqual(['S1', 'S2', 'S3']);
      const batch = await api().get(`/api/imports/${body.id}`).set(bearer(t));
      expect(batch.body).toMatchObject({ status: 'committed', fileName: 'plant-north.xlsx',
        networkVersionId: body.networkVersionId, format: 'xlsx', errorCount: 0 });
      expect(batch.body.committedAt).not.toBeNull();
      const label = t.database.sqlite.prepare('select label from network_versions where id = ?')
        .get(body.networkVersionId) as { label: string };
      expect(label.label).toBe(`Import ${body.id}: plant-north.xlsx`);
    });

  it('answers 422 invalid_workbook with located details and writes no network rows', async () => {
    const sheets = smallNetworkSheets();
    sheets.Suppliers!.push(['S1', 'Second S1', 'DE', 'Saxony', 4, 3, 3, 'no']);
    const before = networkRowCounts(t);
    const response = await upload(t, await buildXlsx(sheets), 'dup.xlsx', { query: 'commit=true' });
    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('invalid_workbook');
    expect(response.body.error.message).toContain('Suppliers, row 5, cell A5');
    expect(response.body.error.details).toEqual([{ sheet: 'Suppliers', row: 5,
      column: 'supplier_code', value: 'S1',
      message: 'duplicate: supplier_code "S1" already appears in row 2' }]);
    expect(networkRowCounts(t)).toEqual(before);
    const list = await api().get('/api/imports?status=rejected').set(bearer(t));
    expect(list.body.items[0]).toMatchObject({ fileName: 'dup.xlsx', status: 'rejected',
      errorCount: 1 });
  });
});

describe('POST /api/imports', () => {
  it('stores a ready batch with name, size, SHA-256, sheets, counts and its bytes', async () => {
    const response = await upload(t, good, 'Łódź wiosna 2026.xlsx');
    expect(response.status).toBe(201);
    const batch = response.body as ImportBatchDto;
    expect(batch).toMatchObject({ status: 'ready', fileName: 'Łódź wiosna 2026.xlsx',
      fileSize: good.length, format: 'xlsx', errorCount: 0, mapping: null,
      networkVersionId: null, committedAt: null,
      createdBy: { id: t.userId('buyer@demo.test'), name: 'Bruno Keller' } });
    const { createHash } = await import('node:crypto');
    expect(batch.sha256).toBe(createHash('sha256').update(good).digest('hex'));
    expect(batch.sheets.map((sheet) => sheet.name)).toEqual(['Plants', 'Products', 'BOM',
      'Suppliers', 'Sourcing', 'Stock']);
    expect(batch.sheets[3]).toEqual({ name: 'Suppliers', rowCount: 4 });
    expect(batch.counts.Sourcing).toBe(4);
    const stored = t.database.sqlite.prepare('select data from import_files where batch_id = ?')
      .get(batch.id) as { data: Buffer };
    expect(Buffer.compare(stored.data, Buffer.from(good))).toBe(0);
  });

  it('answers 413 file_too_large naming the limit in MB, and stores nothing', async () => {
    const before = (await api().get('/api/imports').set(bearer(t))).body.total as number;
    const big = new Uint8Array(64 * 1024 + 1).fill(65);
    const response = await upload(t, big, 'big.csv');
    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('file_too_large');
    expect(response.body.error.message).toContain('0.0625 MB');
    expect((await api().get('/api/imports').set(bearer(t))).body.total).toBe(before);
  });

  it('answers 400 naming body.file when no file is sent, or body.mappingJson when bad',
    async () => {
      const none = await api().post('/api/imports').set(bearer(t)).field('mapping', '1');
      expect(none.status).toBe(400);
      expect(none.body.error.details.issues[0].path).toBe('body.file');
      const badJson = await upload(t, good, 'a.xlsx', { fields: { mappingJson: '{nope' } });
      expect(badJson.status).toBe(400);
      expect(badJson.body.error.message).toContain('body.mappingJson');
      const badShape = await upload(t, good, 'a.xlsx',
        { fields: { mappingJson: JSON.stringify({ Plants: { headerRow: 0 } }) } });
      expect(badShape.status).toBe(400);
      expect(badShape.body.error.details.issues[0].path).toBe('body.mappingJson.Plants.headerRow');
      const unknownMapping = await upload(t, good, 'a.xlsx', { query: 'mapping=999' });
      expect(unknownMapping.status).toBe(404);
      expect(unknownMapping.body.error.message).toBe('There is no saved mapping 999.');
    });

  it('refuses a second file part with 400', async () => {
    const response = await api().post('/api/imports').set(bearer(t))
      .attach('file', Buffer.from(good), 'a.xlsx').attach('other', Buffer.from(good), 'b.xlsx');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('exactly one file');
  });
});

describe('roles and CSRF', () => {
  it.each<Role>(['viewer', 'risk_manager', 'plant_manager'])(
    'refuses an upload by a %s with 403', async (role) => {
      const response = await upload(t, good, 'x.xlsx', { as: ACCOUNT_OF_ROLE[role] });
      expect(response.status).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
    });

  it.each<Role>(['viewer', 'risk_manager', 'plant_manager'])(
    'refuses check, commit and saving a mapping by a %s with 403', async (role) => {
      const auth = bearer(t, ACCOUNT_OF_ROLE[role]);
      expect((await api().post('/api/imports/1/check').set(auth).send({})).status).toBe(403);
      expect((await api().post('/api/imports/1/commit').set(auth)).status).toBe(403);
      expect((await api().post('/api/import-mappings').set(auth)
        .send({ name: 'x', batchId: 1, mapping: {} })).status).toBe(403);
      expect((await api().delete('/api/import-mappings/1').set(auth)).status).toBe(403);
    });

  it.each<Role>(['admin', 'buyer', 'viewer', 'risk_manager', 'plant_manager'])(
    'lets a %s read the history, a batch, the template and the saved mappings', async (role) => {
      const auth = bearer(t, ACCOUNT_OF_ROLE[role]);
      const list = await api().get('/api/imports').set(auth);
      expect(list.status).toBe(200);
      expect(list.body.total).toBeGreaterThan(0);
      const first = list.body.items[0] as ImportBatchDto;
      expect((await api().get(`/api/imports/${first.id}`).set(auth)).body.id).toBe(first.id);
      expect((await api().get('/api/imports/template.xlsx').set(auth)).status).toBe(200);
      expect((await api().get('/api/import-mappings').set(auth)).body).toEqual({ items: [] });
    });

  it('keeps file contents from plant managers (a file covers every plant)', async () => {
    const auth = bearer(t, ACCOUNT_OF_ROLE.plant_manager);
    for (const path of ['inspection', 'problems', 'error-report.xlsx']) {
      const response = await api().get(`/api/imports/1/${path}`).set(auth);
      expect(response.status).toBe(403);
    }
    const viewer = bearer(t, ACCOUNT_OF_ROLE.viewer);
    expect((await api().get('/api/imports/1/problems').set(viewer)).status).toBe(200);
  });

  it('answers 401 without a session', async () => {
    expect((await api().get('/api/imports')).status).toBe(401);
  });

  it('needs the CSRF header on a cookie upload, and accepts it with the header', async () => {
    const cookie = await t.signIn('buyer@demo.test');
    const without = await upload(t, good, 'c.xlsx', { cookie: { Cookie: cookie } });
    expect(without.status).toBe(403);
    expect(without.body.error.code).toBe('csrf_missing');
    const withHeader = await upload(t, good, 'c.xlsx', { cookie: t.cookieHeaders(cookie) });
    expect(withHeader.status).toBe(201);
  });
});

describe('GET /api/imports', () => {
  it('pages newest first and filters by status', async () => {
    const all = await api().get('/api/imports?limit=2').set(bearer(t));
    expect(all.status).toBe(200);
    expect(all.body.items).toHaveLength(2);
    const ids = all.body.items.map((batch: ImportBatchDto) => batch.id);
    expect(ids[0]).toBeGreaterThan(ids[1]);
    const next = await api().get('/api/imports?limit=2&offset=2').set(bearer(t));
    expect(next.body.items[0].id).toBeLessThan(ids[1]);
    const committed = await api().get('/api/imports?status=committed').set(bearer(t));
    expect(committed.body.items.every((b: ImportBatchDto) => b.status === 'committed')).toBe(true);
    expect(committed.body.total).toBe(1);
    const wrong = await api().get('/api/imports?status=done').set(bearer(t));
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toContain('query.status');
  });

  it('answers 404 naming an unknown batch and 400 for a bad id', async () => {
    const missing = await api().get('/api/imports/9999').set(bearer(t));
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe('There is no import 9999.');
    expect((await api().get('/api/imports/abc').set(bearer(t))).status).toBe(400);
  });
});

describe('GET /api/imports/limits', () => {
  it('states the configured upload limit, and only to signed-in users', async () => {
    const response = await api().get('/api/imports/limits').set(bearer(t));
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ uploadMaxBytes: 64 * 1024 });
    expect((await api().get('/api/imports/limits')).status).toBe(401);
  });
});

describe('GET /api/imports/template.xlsx', () => {
  it('downloads the empty template with its Read me sheet', async () => {
    const { response, workbook } = await downloadWorkbook(t, '/api/imports/template.xlsx',
      'viewer@demo.test');
    expect(response.headers['content-disposition']).toMatch(
      /^attachment; filename="?keelson-template\.xlsx"?$/);
    const names = workbook.worksheets.map((sheet) => sheet.name);
    expect(names).toEqual(expect.arrayContaining(['Plants', 'Products', 'BOM', 'Suppliers',
      'Sourcing', 'Stock']));
    expect(names.some((name) => /read me/i.test(name))).toBe(true);
  });
});
