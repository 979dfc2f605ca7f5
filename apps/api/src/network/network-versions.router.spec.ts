/**
 * `/api/network-versions` list, latest, one version and the workbook export, against versions
 * stored with the network store (the export must read back to the stored model).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { NetworkVersionDto, Role } from '@keelson/contracts';
import { readWorkbook } from '@keelson/workbook';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { readNetworkModel } from './network-store';
import { generatedNetwork, insertTestVersion, smallNetwork } from './network-test-versions';

let t: TestApp;
const ids: number[] = [];

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

function get(path: string, role: Role = 'viewer') {
  return request(t.app)
    .get(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`);
}

/** Collects a binary response body as a Buffer. */
function binary(response: request.Response, callback: (error: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => callback(null, Buffer.concat(chunks)));
}

describe('network versions before any import', () => {
  it('answers an empty page and 404 for latest', async () => {
    const list = await get('/api/network-versions');
    expect(list.status).toBe(200);
    expect(list.body).toEqual({ items: [], total: 0 });
    const latest = await get('/api/network-versions/latest');
    expect(latest.status).toBe(404);
    expect(latest.body.error.message).toMatch(/No network has been imported/);
  });
});

describe('network versions', () => {
  beforeAll(() => {
    const admin = t.userId(ACCOUNT_OF_ROLE.admin);
    const buyer = t.userId(ACCOUNT_OF_ROLE.buyer);
    ids.push(insertTestVersion(t.database.db, smallNetwork(), {
      fileName: 'first.xlsx', createdBy: admin, label: 'January',
    }));
    ids.push(insertTestVersion(t.database.db, generatedNetwork(3, 60), {
      fileName: 'second.xlsx', createdBy: null, label: 'February',
    }));
    ids.push(insertTestVersion(t.database.db, smallNetwork(), {
      fileName: 'third.xlsx', createdBy: buyer, label: 'March',
    }));
  });

  it('lists versions newest first with file names, creators and the latest flag', async () => {
    const response = await get('/api/network-versions');
    expect(response.status).toBe(200);
    const items = response.body.items as NetworkVersionDto[];
    expect(response.body.total).toBe(3);
    expect(items.map((v) => v.id)).toEqual([ids[2], ids[1], ids[0]]);
    expect(items.map((v) => v.fileName)).toEqual(['third.xlsx', 'second.xlsx', 'first.xlsx']);
    expect(items.map((v) => v.isLatest)).toEqual([true, false, false]);
    expect(items[0]!.createdBy).toEqual({
      id: t.userId(ACCOUNT_OF_ROLE.buyer), name: 'Bruno Keller',
    });
    expect(items[1]!.createdBy).toBeNull();
    expect(items[2]!.createdBy?.name).toBe('Alma Reyes');
    const small = smallNetwork();
    expect(items[2]!.counts).toEqual({
      plants: 2, products: 3, items: 8, bomLines: small.bom.length, suppliers: 6,
      sourcing: small.sourcing.length, stock: small.stock.length,
    });
    expect(items[2]!.changes.suppliersAdded).toEqual([]);
  });

  it('pages with limit and offset, keeping the total', async () => {
    const first = await get('/api/network-versions?limit=2');
    expect(first.body.total).toBe(3);
    expect(first.body.items.map((v: NetworkVersionDto) => v.id)).toEqual([ids[2], ids[1]]);
    const second = await get('/api/network-versions?limit=2&offset=2');
    expect(second.body.items.map((v: NetworkVersionDto) => v.id)).toEqual([ids[0]]);
    const bad = await get('/api/network-versions?limit=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('query.limit');
  });

  it('answers the latest version and one version by id', async () => {
    const latest = await get('/api/network-versions/latest', 'plant_manager');
    expect(latest.status).toBe(200);
    expect(latest.body.id).toBe(ids[2]);
    expect(latest.body.label).toBe('March');
    const one = await get(`/api/network-versions/${ids[1]}`);
    expect(one.body).toMatchObject({ id: ids[1], label: 'February', isLatest: false });
  });

  it('answers 404 naming an unknown version and 400 for an id that is not a number', async () => {
    const missing = await get(`/api/network-versions/${ids[2]! + 10}`);
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe(`There is no network version ${ids[2]! + 10}.`);
    const suppliers = await get(`/api/network-versions/${ids[2]! + 10}/suppliers`);
    expect(suppliers.status).toBe(404);
    const bad = await get('/api/network-versions/first');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('params.id');
  });

  it('exports a version as a workbook that reads back to the stored model', async () => {
    const response = await get(`/api/network-versions/${ids[1]}/export.xlsx`, 'risk_manager')
      .buffer(true)
      .parse(binary);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/spreadsheetml\.sheet/);
    expect(response.headers['content-disposition']).toContain(
      `keelson-network-version-${ids[1]}.xlsx`);
    const read = await readWorkbook(new Uint8Array(response.body as Buffer));
    expect(read.errors).toEqual([]);
    expect(read.model).toEqual(readNetworkModel(t.database.db, ids[1]!));
  });

  it('exports attributes too, and refuses the export to plant managers', async () => {
    const response = await get(`/api/network-versions/${ids[0]}/export.xlsx`)
      .buffer(true)
      .parse(binary);
    const read = await readWorkbook(new Uint8Array(response.body as Buffer));
    expect(read.model).toEqual(readNetworkModel(t.database.db, ids[0]!));
    expect(read.model?.suppliers[0]?.attributes).toEqual({ 'Buyer note': 'Zürich office' });
    const refused = await get(`/api/network-versions/${ids[0]}/export.xlsx`, 'plant_manager');
    expect(refused.status).toBe(403);
    const missing = await get(`/api/network-versions/${ids[2]! + 10}/export.xlsx`);
    expect(missing.status).toBe(404);
  });
});
