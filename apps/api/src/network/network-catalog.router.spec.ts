/**
 * `/api/network-versions/:id/products`, `/items` and `/bom/:code`: paging, filters, sorts,
 * plant-manager scoping and the bill-of-materials drill-down. References come from the supply
 * model (BOM lines, Sourcing and Stock rows), from the stored item rows for the item table, and
 * for the small network from the facts worked out by hand in network-test-versions.ts.
 */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ITEM_SORT_FIELDS,
  PRODUCT_SORT_FIELDS,
  type BomNodeDto,
  type NetworkItemDto,
  type NetworkProductDto,
  type Role,
  type SupplyModel,
} from '@keelson/contracts';
import { networkItems, networkSupplierPlants } from '@keelson/db';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { generatedNetwork, insertTestVersion, smallNetwork } from './network-test-versions';

let t: TestApp;
let big: number;
let small: number;
const model: SupplyModel = generatedNetwork(5, 400);
let products: NetworkProductDto[];
let items: NetworkItemDto[];
let servedBy: Map<string, Set<string>>;

beforeAll(async () => {
  t = await createTestApp();
  big = insertTestVersion(t.database.db, model);
  small = insertTestVersion(t.database.db, smallNetwork());
  products = model.products.map((p) => ({
    code: p.code, name: p.name, plantCode: p.plantCode, weeklyRevenue: p.weeklyRevenue,
    componentCount: model.bom.filter((line) => line.parentCode === p.code).length,
    row: p.row ?? null,
  }));
  items = t.database.db.select().from(networkItems).where(eq(networkItems.versionId, big)).all()
    .map(({ versionId: _versionId, ...item }) => item);
  servedBy = new Map();
  for (const row of t.database.db.select().from(networkSupplierPlants)
    .where(eq(networkSupplierPlants.versionId, big)).all()) {
    const set = servedBy.get(row.supplierCode) ?? new Set<string>();
    set.add(row.plantCode);
    servedBy.set(row.supplierCode, set);
  }
});
afterAll(() => t.close());

function get(path: string, role: Role = 'risk_manager') {
  return request(t.app)
    .get(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`);
}

async function page<T>(path: string, role?: Role): Promise<{ items: T[]; total: number }> {
  const response = await get(path, role);
  expect(response.status, response.text).toBe(200);
  return response.body;
}

/** Every row of a list, read page by page (at most 1000 a page). */
async function all<T>(path: string, role?: Role): Promise<T[]> {
  const rows: T[] = [];
  for (;;) {
    const next = await page<T>(`${path}&limit=1000&offset=${rows.length}`, role);
    rows.push(...next.items);
    if (next.items.length === 0 || rows.length >= next.total) return rows;
  }
}

const compare = (x: unknown, y: unknown) => (x === y ? 0 : (x as never) < (y as never) ? -1 : 1);
const noCase = (text: string) => text.replace(/[A-Z]/g, (c) => c.toLowerCase());

/** Sorts by `key` (nulls last both ways) and then by the tie-breakers, ascending. */
function sorted<T>(rows: T[], key: (row: T) => unknown, order: string, ties: (keyof T)[]) {
  return [...rows].sort((a, b) => {
    const x = key(a);
    const y = key(b);
    if (x === null || y === null) {
      if (x !== y) return x === null ? 1 : -1;
    } else if (x !== y) {
      return order === 'asc' ? compare(x, y) : -compare(x, y);
    }
    for (const tie of ties) {
      const c = compare(a[tie], b[tie]);
      if (c !== 0) return c;
    }
    return 0;
  });
}

describe('product list', () => {
  it('answers pages with totals and the direct BOM line counts', async () => {
    const all = await page<NetworkProductDto>(`/api/network-versions/${big}/products?limit=1000`);
    expect(all.total).toBe(model.products.length);
    expect(all.items).toEqual(sorted(products, (p) => p.code, 'asc', []));
    const second = await page(`/api/network-versions/${big}/products?limit=2&offset=2`);
    expect(second.items).toEqual(all.items.slice(2, 4));
  });

  it.each(PRODUCT_SORT_FIELDS.flatMap((field) => [[field, 'asc'], [field, 'desc']] as const))(
    'sorts by %s %s, then by code',
    async (field, order) => {
      const expected = sorted(products, (p) => (field === 'name' ? noCase(p.name) : p[field]),
        order, ['code']).map((p) => p.code);
      const answer = await page<NetworkProductDto>(
        `/api/network-versions/${big}/products?limit=1000&sort=${field}&order=${order}`);
      expect(answer.items.map((p) => p.code)).toEqual(expected);
    },
  );

  it('filters by plant and searches code or name', async () => {
    const south = await page<NetworkProductDto>(
      `/api/network-versions/${big}/products?limit=1000&plant=P-SOUTH`);
    const expected = products.filter((p) => p.plantCode === 'P-SOUTH').map((p) => p.code);
    expect(expected.length).toBeGreaterThan(0);
    expect(south.items.map((p) => p.code)).toEqual(expected);
    const search = await page<NetworkProductDto>(`/api/network-versions/${small}/products?q=VALVE`);
    expect(search.items.map((p) => p.code)).toEqual(['F2']);
    const code = await page<NetworkProductDto>(`/api/network-versions/${small}/products?q=f3`);
    expect(code.items.map((p) => p.code)).toEqual(['F3']);
  });

  it('shows a plant manager only their plants, and 403 for another plant', async () => {
    const own = await page<NetworkProductDto>(
      `/api/network-versions/${small}/products`, 'plant_manager');
    expect(own).toEqual({
      items: [
        { code: 'F1', name: 'Pump housing', plantCode: 'P-NORTH', weeklyRevenue: 50_000,
          componentCount: 2, row: 2 },
        { code: 'F2', name: 'Valve body', plantCode: 'P-NORTH', weeklyRevenue: 30_000,
          componentCount: 1, row: 3 },
      ],
      total: 2,
    });
    const other = await get(`/api/network-versions/${small}/products?plant=P-SOUTH`,
      'plant_manager');
    expect(other.status).toBe(403);
    expect(other.body.error.code).toBe('plant_forbidden');
  });
});

describe('item list', () => {
  it('holds more items than one page, so paging is exercised', () => {
    expect(items.length).toBeGreaterThan(1000);
  });

  it.each(ITEM_SORT_FIELDS.flatMap((field) => [[field, 'asc'], [field, 'desc']] as const))(
    'sorts by %s %s, then by code and holder',
    async (field, order) => {
      const expected = sorted(items, (i) => i[field], order, ['code', 'holderCode']);
      const answer = await all<NetworkItemDto>(
        `/api/network-versions/${big}/items?sort=${field}&order=${order}`);
      expect(answer).toEqual(expected);
    },
  );

  it('filters by kind, single sourcing, search and plant (held there or by its suppliers)',
    async () => {
      const base = `/api/network-versions/${big}/items?sort=code`;
      const codes = (rows: NetworkItemDto[]) => rows.map((i) => `${i.code}@${i.holderCode}`);
      const ref = (keep: (i: NetworkItemDto) => boolean) =>
        codes(sorted(items.filter(keep), (i) => i.code, 'asc', ['holderCode']));
      expect(codes(await all(`${base}&kind=made`))).toEqual(ref((i) => i.kind === 'made'));
      const single = (i: NetworkItemDto) => i.kind === 'bought' && i.qualifiedSources <= 1;
      expect(codes(await all(`${base}&singleSourced=true`))).toEqual(ref(single));
      expect(codes(await all(`${base}&singleSourced=false`))).toEqual(ref((i) => !single(i)));
      expect(codes(await all(`${base}&q=as-0000`)))
        .toEqual(ref((i) => i.code.toLowerCase().includes('as-0000')));
      const atSouth = (i: NetworkItemDto) => i.holderKind === 'plant'
        ? i.holderCode === 'P-SOUTH'
        : servedBy.get(i.holderCode)?.has('P-SOUTH') === true;
      const south = await all<NetworkItemDto>(`${base}&plant=P-SOUTH`);
      expect(codes(south)).toEqual(ref(atSouth));
      expect(south.some((i) => i.holderKind === 'supplier')).toBe(true);
      expect(south.length).toBeLessThan(items.length);
    });

  it('lists the hand-worked items of the small network, scoped for a plant manager', async () => {
    const all = await page<NetworkItemDto>(`/api/network-versions/${small}/items?sort=holderCode`);
    expect(all.items.map((i) => [i.code, i.holderCode, i.kind, i.qualifiedSources, i.usedIn,
      i.weeksOfCover])).toEqual([
      ['A1', 'P-NORTH', 'made', 0, 1, null], ['I1', 'P-NORTH', 'bought', 1, 1, 2],
      ['I2', 'P-NORTH', 'bought', 2, 2, 1.5], ['I3', 'P-NORTH', 'bought', 1, 1, null],
      ['I2', 'P-SOUTH', 'bought', 1, 1, null], ['I4', 'P-SOUTH', 'bought', 1, 1, 3],
      ['C1', 'S2', 'bought', 1, 1, null], ['C2', 'S5', 'bought', 1, 1, null],
    ]);
    const own = await page<NetworkItemDto>(
      `/api/network-versions/${small}/items?sort=holderCode`, 'plant_manager');
    expect(own.items.map((i) => `${i.code}@${i.holderCode}`))
      .toEqual(['A1@P-NORTH', 'I1@P-NORTH', 'I2@P-NORTH', 'I3@P-NORTH', 'C1@S2']);
    const forbidden = await get(`/api/network-versions/${small}/items?plant=P-SOUTH`,
      'plant_manager');
    expect(forbidden.status).toBe(403);
  });
});

describe('bill of materials drill-down', () => {
  /** The expected children of a parent at a plant, straight from the model's rows. */
  function childrenFromModel(parent: string, plant: string) {
    const isMade = (code: string) => model.bom.some((line) => line.parentCode === code);
    return model.bom.filter((line) => line.parentCode === parent).map((line) => {
      const made = isMade(line.childCode);
      const cover = model.stock.find((s) => s.plantCode === plant && s.itemCode === line.childCode);
      return {
        code: line.childCode,
        qtyPer: line.qtyPer,
        kind: made ? 'made' : 'bought',
        qualifiedSources: made ? null : model.sourcing.filter((r) => r.buyerCode === plant
          && r.itemCode === line.childCode && r.isQualified).length,
        weeksOfCover: made ? null : (cover?.weeksOfCover ?? null),
        hasChildren: made,
      };
    });
  }

  it('opens a product, a made item and a bought item of a generated network', async () => {
    const product = model.products[3]!;
    const top = (await get(`/api/network-versions/${big}/bom/${product.code}`)).body as BomNodeDto;
    expect(top).toEqual({
      code: product.code, kind: 'product', plantCode: product.plantCode, name: product.name,
      children: childrenFromModel(product.code, product.plantCode), sources: [],
    });
    const made = top.children.find((child) => child.kind === 'made')!;
    const assembly = (await get(`/api/network-versions/${big}/bom/${made.code}`)).body;
    expect(assembly).toEqual({
      code: made.code, kind: 'made', plantCode: product.plantCode, name: null,
      children: childrenFromModel(made.code, product.plantCode), sources: [],
    });
    const bought = (assembly as BomNodeDto).children.find((child) => child.kind === 'bought')!;
    const part = (await get(
      `/api/network-versions/${big}/bom/${bought.code}?plant=${product.plantCode}`)).body;
    expect(part.kind).toBe('bought');
    expect(part.children).toEqual([]);
    const rows = model.sourcing.filter((r) => r.buyerCode === product.plantCode
      && r.itemCode === bought.code);
    expect(rows.length).toBeGreaterThan(0);
    expect((part as BomNodeDto).sources.map((s) => [s.supplierCode, s.isQualified, s.row]))
      .toEqual(rows.map((r) => [r.supplierCode, r.isQualified, r.row]));
    const qualified = rows.filter((r) => r.isQualified).length;
    expect((part as BomNodeDto).sources.every((s) => s.qualifiedSources === qualified)).toBe(true);
  });

  it('needs the plant for an item used at two plants, and checks it', async () => {
    const both = await get(`/api/network-versions/${small}/bom/I2`);
    expect(both.status).toBe(400);
    expect(both.body.error.message).toContain('P-NORTH, P-SOUTH');
    const south = (await get(`/api/network-versions/${small}/bom/I2?plant=P-SOUTH`))
      .body as BomNodeDto;
    expect(south.sources.map((s) => [s.buyerName, s.supplierCode, s.qualifiedSources]))
      .toEqual([['Castellar Works', 'S3', 1]]);
    const wrongPlant = await get(`/api/network-versions/${small}/bom/F1?plant=P-SOUTH`);
    expect(wrongPlant.status).toBe(400);
    expect(wrongPlant.body.error.message).toContain('made at plant P-NORTH');
    const notUsed = await get(`/api/network-versions/${small}/bom/I4?plant=P-NORTH`);
    expect(notUsed.status).toBe(404);
  });

  it('gives the hand-worked children of F1 and A1', async () => {
    const f1 = (await get(`/api/network-versions/${small}/bom/F1`)).body as BomNodeDto;
    expect(f1.children).toEqual([
      { code: 'A1', qtyPer: 2, kind: 'made', qualifiedSources: null, weeksOfCover: null,
        hasChildren: true },
      { code: 'I3', qtyPer: 1, kind: 'bought', qualifiedSources: 1, weeksOfCover: null,
        hasChildren: false },
    ]);
    const a1 = (await get(`/api/network-versions/${small}/bom/A1`)).body as BomNodeDto;
    expect(a1.children.map((c) => [c.code, c.qtyPer, c.qualifiedSources, c.weeksOfCover]))
      .toEqual([['I1', 4, 1, 2], ['I2', 1, 2, 1.5]]);
  });

  it('scopes the drill-down for a plant manager and names unknown codes', async () => {
    const own = await get(`/api/network-versions/${small}/bom/I2`, 'plant_manager');
    expect(own.status).toBe(200);
    expect(own.body.plantCode).toBe('P-NORTH');
    const product = await get(`/api/network-versions/${small}/bom/F3`, 'plant_manager');
    expect(product.status).toBe(404);
    const item = await get(`/api/network-versions/${small}/bom/I4`, 'plant_manager');
    expect(item.status).toBe(404);
    const forbidden = await get(`/api/network-versions/${small}/bom/I2?plant=P-SOUTH`,
      'plant_manager');
    expect(forbidden.status).toBe(403);
    expect(forbidden.body.error.code).toBe('plant_forbidden');
    const unknown = await get(`/api/network-versions/${small}/bom/ZZ-9`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toBe(
      `There is no product or item ZZ-9 at a plant in version ${small}.`);
    const version = await get(`/api/network-versions/${small + 9}/bom/F1`);
    expect(version.status).toBe(404);
  });
});
