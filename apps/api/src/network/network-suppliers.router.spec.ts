/**
 * `/api/network-versions/:id/suppliers` and `/suppliers/:code`: paging, search (with LIKE
 * wildcards escaped), filters, every sort in both directions, and plant-manager scoping. The
 * references are computed here from the supply model itself (tiers by the supply-graph library,
 * counts by filtering the Sourcing rows) and, for the small network, by hand.
 */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  SUPPLIER_SORT_FIELDS,
  type NetworkSupplierDto,
  type Role,
  type SupplierDetailDto,
  type SupplierSortField,
  type SupplyModel,
} from '@keelson/contracts';
import { networkSupplierPlants } from '@keelson/db';
import { buildSupplyGraph, tiers } from '@keelson/supply-graph';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { generatedNetwork, insertTestVersion, smallNetwork } from './network-test-versions';

let t: TestApp;
let big: number;
let small: number;
const model: SupplyModel = generatedNetwork(21, 300);
/** The reference row of every generated supplier. */
let reference: NetworkSupplierDto[];

beforeAll(async () => {
  t = await createTestApp();
  big = insertTestVersion(t.database.db, model, { fileName: 'generated.xlsx' });
  small = insertTestVersion(t.database.db, smallNetwork(), {
    fileName: 'small.xlsx', createdBy: t.userId(ACCOUNT_OF_ROLE.admin),
    createdAt: '2026-03-01T10:00:00.000Z',
  });
  const tierOf = tiers(buildSupplyGraph(model));
  const served = t.database.db.select().from(networkSupplierPlants)
    .where(eq(networkSupplierPlants.versionId, big)).all();
  reference = model.suppliers.map((s) => ({
    code: s.code, name: s.name, country: s.country, region: s.region,
    tier: tierOf.get(s.code) ?? null, recoveryWeeks: s.recoveryWeeks,
    financialHealth: s.financialHealth, deliveryScore: s.deliveryScore,
    hasContinuityPlan: s.hasContinuityPlan,
    plants: served.filter((row) => row.supplierCode === s.code).map((row) => row.plantCode).sort(),
    sellsCount: model.sourcing.filter((r) => r.supplierCode === s.code).length,
    buysCount: model.sourcing.filter((r) => r.buyerCode === s.code).length,
    row: s.row ?? null,
  }));
});
afterAll(() => t.close());

function get(path: string, role: Role = 'buyer') {
  return request(t.app)
    .get(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`);
}

async function codes(version: number, query: string, role: Role = 'buyer'): Promise<string[]> {
  const path = `/api/network-versions/${version}/suppliers?limit=1000&${query}`;
  const response = await get(path, role);
  expect(response.status, response.text).toBe(200);
  expect(response.body.total).toBe(response.body.items.length);
  return response.body.items.map((s: NetworkSupplierDto) => s.code);
}

const byCode = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
// SQLite's NOCASE folds ASCII letters only; the generated names are ASCII.
const noCase = (text: string) => text.replace(/[A-Z]/g, (c) => c.toLowerCase());

/** Expected order: the field (nulls last both ways; name, region without case), then code. */
function expectedOrder(field: SupplierSortField, order: 'asc' | 'desc'): string[] {
  const value = (s: NetworkSupplierDto) => {
    const v = s[field];
    return typeof v === 'string' && (field === 'name' || field === 'region') ? noCase(v) : v;
  };
  return [...reference].sort((a, b) => {
    const x = value(a);
    const y = value(b);
    if (x === null || y === null) {
      if (x !== y) return x === null ? 1 : -1;
    } else if (x !== y) {
      const less = x < y ? -1 : 1;
      return order === 'asc' ? less : -less;
    }
    return byCode(a.code, b.code);
  }).map((s) => s.code);
}

describe('supplier list of a generated network', () => {
  it('answers a page with the total and rows that match the model', async () => {
    const response = await get(`/api/network-versions/${big}/suppliers?limit=25&offset=50`);
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(300);
    expect(response.body.items).toEqual(reference.slice(50, 75));
  });

  it.each(SUPPLIER_SORT_FIELDS.flatMap((field) => [[field, 'asc'], [field, 'desc']] as const))(
    'sorts by %s %s, then by code',
    async (field, order) => {
      const expected = expectedOrder(field, order);
      expect(await codes(big, `sort=${field}&order=${order}`)).toEqual(expected);
      // A later page is the same slice of the same order.
      const page = await get(
        `/api/network-versions/${big}/suppliers?sort=${field}&order=${order}&limit=40&offset=120`);
      expect(page.body.items.map((s: NetworkSupplierDto) => s.code))
        .toEqual(expected.slice(120, 160));
    },
  );

  it('filters by tier, country (any case), region (any case) and plant', async () => {
    const tierTwo = reference.filter((s) => s.tier === 2).map((s) => s.code);
    expect(tierTwo.length).toBeGreaterThan(0);
    expect(await codes(big, 'tier=2')).toEqual(tierTwo);
    const china = reference.filter((s) => s.country === 'CN').map((s) => s.code);
    expect(china.length).toBeGreaterThan(0);
    expect(await codes(big, 'country=cn')).toEqual(china);
    const asia = reference.filter((s) => s.region === 'Asia').map((s) => s.code);
    expect(await codes(big, 'region=asia')).toEqual(asia);
    const south = reference.filter((s) => s.plants.includes('P-SOUTH')).map((s) => s.code);
    expect(south.length).toBeGreaterThan(0);
    expect(south.length).toBeLessThan(300);
    expect(await codes(big, 'plant=P-SOUTH')).toEqual(south);
    const combined = reference
      .filter((s) => s.tier === 2 && s.region === 'Asia' && s.plants.includes('P-SOUTH'))
      .map((s) => s.code);
    expect(await codes(big, 'tier=2&region=Asia&plant=P-SOUTH')).toEqual(combined);
    expect(await codes(big, 'country=ZZ')).toEqual([]);
  });

  it('searches code or name without case', async () => {
    const expected = reference
      .filter((s) => s.code.toLowerCase().includes('su-00002')
        || s.name.toLowerCase().includes('su-00002'))
      .map((s) => s.code);
    expect(expected.length).toBe(10);
    expect(await codes(big, 'q=su-00002')).toEqual(expected);
    const byName = reference.filter((s) => s.name.toLowerCase().includes('supplier 12'))
      .map((s) => s.code);
    expect(await codes(big, `q=${encodeURIComponent('SUPPLIER 12')}`)).toEqual(byName);
  });

  it('refuses an unknown sort field and a tier out of range, naming the parameter', async () => {
    const sort = await get(`/api/network-versions/${big}/suppliers?sort=colour`);
    expect(sort.status).toBe(400);
    expect(sort.body.error.details.issues[0].path).toBe('query.sort');
    const tier = await get(`/api/network-versions/${big}/suppliers?tier=0`);
    expect(tier.body.error.details.issues[0].path).toBe('query.tier');
  });
});

describe('supplier search escaping (small network)', () => {
  it('treats % and _ as text, not wildcards', async () => {
    expect(await codes(small, `q=${encodeURIComponent('%')}`)).toEqual(['S1']);
    expect(await codes(small, `q=${encodeURIComponent('50%')}`)).toEqual(['S1']);
    expect(await codes(small, 'q=_')).toEqual(['S2']);
    expect(await codes(small, `q=${encodeURIComponent('\\')}`)).toEqual([]);
    expect(await codes(small, 'q=s')).toEqual(['S1', 'S2', 'S3', 'S4', 'S5', 'S6']);
  });
});

describe('plant-manager scoping (small network, P-NORTH manager)', () => {
  it('lists only suppliers that serve their plants, with plants and sells in scope', async () => {
    const response = await get(`/api/network-versions/${small}/suppliers`, 'plant_manager');
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(4);
    const rows = response.body.items as NetworkSupplierDto[];
    expect(rows.map((s) => s.code)).toEqual(['S1', 'S2', 'S3', 'S4']);
    // S3 also sells I2 to P-SOUTH; S4 also sells C2 to S5, which serves only P-SOUTH.
    expect(rows.map((s) => [s.code, s.plants, s.sellsCount, s.buysCount])).toEqual([
      ['S1', ['P-NORTH'], 1, 0], ['S2', ['P-NORTH'], 2, 1],
      ['S3', ['P-NORTH'], 2, 0], ['S4', ['P-NORTH'], 1, 0],
    ]);
    const all = await get(`/api/network-versions/${small}/suppliers`, 'viewer');
    expect((all.body.items as NetworkSupplierDto[]).map((s) => [s.code, s.plants, s.sellsCount]))
      .toEqual([
        ['S1', ['P-NORTH'], 1], ['S2', ['P-NORTH'], 2], ['S3', ['P-NORTH', 'P-SOUTH'], 3],
        ['S4', ['P-NORTH', 'P-SOUTH'], 2], ['S5', ['P-SOUTH'], 1], ['S6', [], 0],
      ]);
  });

  it('sorts by sells in scope', async () => {
    expect(await codes(small, 'sort=sellsCount&order=desc', 'plant_manager'))
      .toEqual(['S2', 'S3', 'S1', 'S4']);
    expect(await codes(small, 'sort=sellsCount&order=desc')).toEqual(
      ['S3', 'S2', 'S4', 'S1', 'S5', 'S6']);
  });

  it('answers 403 plant_forbidden for another plant and accepts their own', async () => {
    const response = await get(
      `/api/network-versions/${small}/suppliers?plant=P-SOUTH`, 'plant_manager');
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('plant_forbidden');
    expect(response.body.error.message).toContain('P-SOUTH');
    expect(await codes(small, 'plant=P-NORTH', 'plant_manager')).toEqual(['S1', 'S2', 'S3', 'S4']);
    expect(await codes(small, 'plant=P-SOUTH', 'risk_manager')).toEqual(['S3', 'S4', 'S5']);
  });

  it('answers 404 for a supplier that does not serve their plants', async () => {
    const other = await get(`/api/network-versions/${small}/suppliers/S5`, 'plant_manager');
    expect(other.status).toBe(404);
    expect(other.body.error.message).toMatch(/does not serve your plants/);
    const idle = await get(`/api/network-versions/${small}/suppliers/S6`, 'plant_manager');
    expect(idle.status).toBe(404);
    const own = await get(`/api/network-versions/${small}/suppliers/S3`, 'plant_manager');
    expect(own.status).toBe(200);
    expect((own.body as SupplierDetailDto).sells.map((r) => [r.buyerCode, r.itemCode]))
      .toEqual([['P-NORTH', 'I1'], ['P-NORTH', 'I2']]);
  });
});

describe('supplier detail (small network)', () => {
  it('shows what it sells to whom, what it buys, its fields and its import', async () => {
    const response = await get(`/api/network-versions/${small}/suppliers/S2`);
    expect(response.status).toBe(200);
    const detail = response.body as SupplierDetailDto;
    expect(detail).toMatchObject({
      code: 'S2', name: 'Under_score Metals', country: 'CN', region: 'Asia', tier: 1,
      recoveryWeeks: 4, financialHealth: 3, deliveryScore: 4, hasContinuityPlan: true,
      plants: ['P-NORTH'], sellsCount: 2, buysCount: 1, row: 3, networkVersionId: small,
      attributes: {},
    });
    expect(detail.sells).toEqual([
      { buyerCode: 'P-NORTH', buyerKind: 'plant', buyerName: 'Varnholm Works', itemCode: 'I2',
        supplierCode: 'S2', supplierName: 'Under_score Metals', sharePct: 50,
        isQualified: true, qualifiedSources: 2, row: 4 },
      { buyerCode: 'P-NORTH', buyerKind: 'plant', buyerName: 'Varnholm Works', itemCode: 'I3',
        supplierCode: 'S2', supplierName: 'Under_score Metals', sharePct: null,
        isQualified: true, qualifiedSources: 1, row: 6 },
    ]);
    expect(detail.buys).toEqual([
      { buyerCode: 'S2', buyerKind: 'supplier', buyerName: 'Under_score Metals',
        itemCode: 'C1', supplierCode: 'S4', supplierName: 'Deep Tier Alloys', sharePct: null,
        isQualified: true, qualifiedSources: 1, row: 9 },
    ]);
    expect(detail.importBatch).toMatchObject({
      fileName: 'small.xlsx', createdAt: '2026-03-01T10:00:00.000Z', createdBy: 'Alma Reyes',
    });
  });

  it('counts only qualified sources, keeps attributes and names supplier buyers', async () => {
    const s1 = (await get(`/api/network-versions/${small}/suppliers/S1`)).body as SupplierDetailDto;
    expect(s1.attributes).toEqual({ 'Buyer note': 'Zürich office' });
    expect(s1.sells.map((r) => [r.itemCode, r.sharePct, r.qualifiedSources])).toEqual([
      ['I1', 60, 1]]);
    const s3 = (await get(`/api/network-versions/${small}/suppliers/S3`)).body as SupplierDetailDto;
    expect(s3.sells.map((r) => [r.buyerCode, r.itemCode, r.isQualified, r.qualifiedSources]))
      .toEqual([
        ['P-NORTH', 'I1', false, 1], ['P-NORTH', 'I2', true, 2], ['P-SOUTH', 'I2', true, 1],
      ]);
    const s4 = (await get(`/api/network-versions/${small}/suppliers/S4`)).body as SupplierDetailDto;
    expect(s4).toMatchObject({ tier: 2, financialHealth: null, hasContinuityPlan: null });
    expect(s4.sells.map((r) => [r.buyerKind, r.buyerName, r.itemCode])).toEqual([
      ['supplier', 'Under_score Metals', 'C1'], ['supplier', 'Southern Plastics', 'C2']]);
    const s6 = (await get(`/api/network-versions/${small}/suppliers/S6`)).body as SupplierDetailDto;
    expect(s6).toMatchObject({ tier: null, plants: [], sells: [], buys: [] });
  });

  it('answers 404 naming an unknown supplier or version', async () => {
    const supplier = await get(`/api/network-versions/${small}/suppliers/S99`);
    expect(supplier.status).toBe(404);
    expect(supplier.body.error.message).toBe(
      `There is no supplier S99 in network version ${small}.`);
    const version = await get(`/api/network-versions/${small + 5}/suppliers/S1`);
    expect(version.status).toBe(404);
    expect(version.body.error.message).toBe(`There is no network version ${small + 5}.`);
  });
});
