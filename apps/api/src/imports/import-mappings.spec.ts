/**
 * The mapping flow: a file whose sheet and headers are not the template's needs a mapping; the
 * buyer checks it with one, saves it, and the next file laid out the same way is offered it.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ImportBatchDto, ImportMappingDto, WorkbookMapping } from '@keelson/contracts';
import { createTestApp, type TestApp } from '../testing/test-app';
import { bearer, buildXlsx, smallNetworkSheets, upload, type SheetRows } from './import-fixtures';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const api = () => request(t.app);

/** The small network with Suppliers exported by another system as "Vendors". */
function vendorSheets(quarter: string): Record<string, SheetRows> {
  const sheets = smallNetworkSheets();
  const suppliers = sheets.Suppliers!;
  delete sheets.Suppliers;
  sheets.Vendors = [
    ['Vendor no', 'Vendor', 'Land', 'Region', 'Recovery (weeks)'],
    ...suppliers.slice(1).map((row) => [row[0], `${row[1]} ${quarter}`, row[2], row[3], row[4]]),
  ];
  return sheets;
}

const VENDOR_MAPPING: WorkbookMapping = {
  Suppliers: {
    sheetName: 'Vendors',
    columns: { supplier_code: 'Vendor no', supplier_name: 'Vendor', country: 'Land',
      region: 'Region', recovery_weeks: 'Recovery (weeks)' },
  },
};

describe('the mapping flow', () => {
  let first: ImportBatchDto;
  let saved: ImportMappingDto;

  it('marks a file with non-template headers needs_mapping, naming the missing sheet',
    async () => {
      const response = await upload(t, await buildXlsx(vendorSheets('Q1')), 'vendors-q1.xlsx');
      first = response.body;
      expect(first).toMatchObject({ status: 'needs_mapping', suggestedMapping: null });
      const problems = await api().get(`/api/imports/${first.id}/problems`).set(bearer(t));
      expect(problems.body.items.map((p: { message: string }) => p.message))
        .toContain('the sheet Suppliers is missing');
      const inspection = await api().get(`/api/imports/${first.id}/inspection`).set(bearer(t));
      expect(inspection.body.suggestions.Suppliers.sheetName).toBe('Vendors');
      expect(inspection.body.sheets.find((s: { name: string }) => s.name === 'Vendors').headers)
        .toEqual(['Vendor no', 'Vendor', 'Land', 'Region', 'Recovery (weeks)']);
    });

  it('is ready once checked with the mapping, which the batch keeps', async () => {
    const wrong = await api().post(`/api/imports/${first.id}/check`).set(bearer(t))
      .send({ mapping: { Suppliers: { sheetName: 'Lieferanten' } } });
    expect(wrong.body.status).toBe('needs_mapping');
    const response = await api().post(`/api/imports/${first.id}/check`).set(bearer(t))
      .send({ mapping: VENDOR_MAPPING });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ status: 'ready', errorCount: 0,
      mapping: VENDOR_MAPPING, counts: { Suppliers: 3 } });
    const invalid = await api().post(`/api/imports/${first.id}/check`).set(bearer(t))
      .send({ mapping: { Vendors: {} } });
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.message).toContain('body.mapping');
  });

  it('saves the mapping with the file\'s header signature; a duplicate name is 409',
    async () => {
      const response = await api().post('/api/import-mappings').set(bearer(t))
        .send({ name: 'Vendor export', batchId: first.id, mapping: VENDOR_MAPPING });
      expect(response.status).toBe(201);
      saved = response.body;
      expect(saved).toMatchObject({ name: 'Vendor export', mapping: VENDOR_MAPPING,
        createdBy: { name: 'Bruno Keller' }, lastUsedAt: null });
      expect(saved.headerSignature).toMatch(/^[0-9a-f]{64}$/);
      const again = await api().post('/api/import-mappings').set(bearer(t))
        .send({ name: 'Vendor export', batchId: first.id, mapping: VENDOR_MAPPING });
      expect(again.status).toBe(409);
      expect(again.body.error.code).toBe('mapping_name_taken');
      const noBatch = await api().post('/api/import-mappings').set(bearer(t))
        .send({ name: 'Other', batchId: 9999, mapping: VENDOR_MAPPING });
      expect(noBatch.status).toBe(404);
      const list = await api().get('/api/import-mappings').set(bearer(t, 'viewer@demo.test'));
      expect(list.body.items.map((m: ImportMappingDto) => m.name)).toEqual(['Vendor export']);
    });

  it('suggests the saved mapping for the next file with the same headers, and uses it by id',
    async () => {
      const next = await upload(t, await buildXlsx(vendorSheets('Q2')), 'vendors-q2.xlsx');
      expect(next.body).toMatchObject({ status: 'needs_mapping',
        suggestedMapping: { id: saved.id, name: 'Vendor export' } });
      const other = await upload(t, await buildXlsx(smallNetworkSheets()), 'template.xlsx');
      expect(other.body.suggestedMapping).toBeNull();
      const byId = await upload(t, await buildXlsx(vendorSheets('Q2')), 'vendors-q2.xlsx',
        { fields: { mapping: String(saved.id) }, query: 'commit=true' });
      expect(byId.status).toBe(201);
      expect(byId.body.counts.Suppliers).toBe(3);
      const used = await api().get('/api/import-mappings').set(bearer(t));
      expect(used.body.items[0].lastUsedAt).toBe(t.clock.now.toISOString());
      const withSaved = await api().post(`/api/imports/${next.body.id}/check`).set(bearer(t))
        .send({ mappingId: saved.id });
      expect(withSaved.body).toMatchObject({ status: 'ready', mapping: VENDOR_MAPPING });
      const inspected = await api()
        .get(`/api/imports/${other.body.id}/inspection?mappingId=${saved.id}`).set(bearer(t));
      expect(inspected.body.suggestions.Suppliers.sheetName).toBeNull();
    });

  it('accepts the mapping as JSON in the upload', async () => {
    const response = await upload(t, await buildXlsx(vendorSheets('Q3')), 'vendors-q3.xlsx',
      { fields: { mappingJson: JSON.stringify(VENDOR_MAPPING) } });
    expect(response.body).toMatchObject({ status: 'ready', mapping: VENDOR_MAPPING });
  });

  it('deletes a saved mapping; a second delete is 404', async () => {
    expect((await api().delete(`/api/import-mappings/${saved.id}`).set(bearer(t))).status)
      .toBe(204);
    const again = await api().delete(`/api/import-mappings/${saved.id}`).set(bearer(t));
    expect(again.status).toBe(404);
    expect(again.body.error.message).toBe(`There is no saved mapping ${saved.id}.`);
    const batch = await api().get(`/api/imports/${first.id}`).set(bearer(t));
    expect(batch.body).toMatchObject({ mapping: VENDOR_MAPPING, suggestedMapping: null });
  });
});
