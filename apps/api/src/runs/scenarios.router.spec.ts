/**
 * Scenarios on the demo network (version 1). The reference of a country failure is
 * `analyse(model, {failCountry: 'CZ'}).scenario` of `@keelson/supply-graph` on `readWorkbook`
 * of `data/demo/keelson-demo.xlsx` (what `npm run analyze -- --fail-country CZ` prints); a
 * joint failure of both sources of a dual-sourced item is built here from the model's rows.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role, ScenarioDto, ScenarioResultDto, SupplyModel } from '@keelson/contracts';
import { analyse, buildSupplyGraph, failurePaths, impactOf } from '@keelson/supply-graph';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { demoModel, postAs } from './run-spec-helpers';
import { insertTestVersion, smallNetwork } from '../network/network-test-versions';
import { NetworkGraphCache } from '../network/network-graph-cache';

let t: TestApp;
let model: SupplyModel;

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  model = await demoModel();
}, 60_000);
afterAll(() => t.close());

const evaluate = (body: object, role: Role = 'viewer', version = 1) =>
  postAs(t, `/api/network-versions/${version}/scenario`, body, role);

function checkPaths(result: ScenarioResultDto) {
  expect(result.failurePaths.map((p) => p.product)).toEqual(result.productsLost);
  for (const path of result.failurePaths) {
    expect(path.nodes[0]!.kind).toBe('supplier');
    expect(result.failed).toContain(path.nodes[0]!.code);
    expect(path.nodes.at(-1)).toMatchObject({ kind: 'product', code: path.product, column: 0 });
    path.nodes.forEach((node, i) => expect(node.column).toBe(path.nodes.length - 1 - i));
  }
}

describe('POST /api/network-versions/:id/scenario', () => {
  it('equals the analyser for every supplier of CZ failing, for any role', async () => {
    const expected = analyse(model, { failCountry: 'CZ' }).scenario!;
    expect(expected.productsLost.length).toBeGreaterThan(0);
    const response = await evaluate({ countries: ['cz'] });
    expect(response.status).toBe(200);
    const result = response.body as ScenarioResultDto;
    const { failurePaths: _paths, networkVersionId, ...rest } = result;
    expect(networkVersionId).toBe(1);
    expect(rest).toEqual(expected);
    checkPaths(result);
  });

  it('traces a product lost only when two sources fail together', async () => {
    // Find an item at a plant with exactly two qualified sources, each also selling elsewhere.
    const sources = new Map<string, string[]>();
    for (const row of model.sourcing) {
      if (!row.isQualified) continue;
      const key = `${row.itemCode}@${row.buyerCode}`;
      sources.set(key, [...(sources.get(key) ?? []), row.supplierCode]);
    }
    const graph = buildSupplyGraph(model);
    const pair = [...sources.values()].find((list) => list.length === 2 &&
      impactOf(graph, list).productsLost.some((product) =>
        list.every((s) => !impactOf(graph, [s]).productsLost.includes(product))))!;
    expect(pair).toBeDefined();
    const response = await evaluate({ suppliers: pair });
    const result = response.body as ScenarioResultDto;
    expect(result.productsLost).toEqual(impactOf(graph, pair).productsLost);
    const jointOnly = result.productsLost.filter((product) =>
      pair.every((s) => failurePaths(graph, s).every((p) => p.productCode !== product)));
    expect(jointOnly.length).toBeGreaterThan(0);
    checkPaths(result);
  });

  it('adds every supplier of a region, ignoring case', async () => {
    const region = model.suppliers[0]!.region;
    const members = model.suppliers.filter((s) => s.region === region).map((s) => s.code).sort();
    const result = (await evaluate({ regions: [` ${region.toUpperCase()} `] })).body;
    expect(result.failed).toEqual(members);
  });

  it('names unknown supplier codes with 400', async () => {
    const response = await evaluate({ suppliers: ['S-1-001', 'NOPE-2', 'NOPE-1'] });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/no supplier NOPE-1, NOPE-2/);
    expect(response.body.error.details.unknown).toEqual(['NOPE-1', 'NOPE-2']);
    expect((await evaluate({}, 'viewer', 42)).status).toBe(404);
  });

  it('shows a plant manager only the lost products of their plants', async () => {
    const all = (await evaluate({ countries: ['CZ'] })).body as ScenarioResultDto;
    const own = (await evaluate({ countries: ['CZ'] }, 'plant_manager'))
      .body as ScenarioResultDto;
    const north = all.products.filter((p) => p.plantCode === 'P-NORTH');
    expect(own.products).toEqual(north);
    expect(own.revenueExposedPerWeek).toBeCloseTo(
      north.reduce((sum, p) => sum + p.weeklyRevenue, 0), 6);
  });
});

describe('/api/scenarios', () => {
  it('saves, lists, replaces and deletes a scenario', async () => {
    const created = await postAs(t, '/api/scenarios', { name: 'Czech outage',
      countries: ['CZ'], description: 'Floods along the river' });
    expect(created.status).toBe(201);
    const scenario = created.body as ScenarioDto;
    expect(scenario).toMatchObject({ name: 'Czech outage', countries: ['CZ'], suppliers: [],
      regions: [], createdBy: { id: t.userId(ACCOUNT_OF_ROLE.risk_manager) } });
    const token = t.tokenFor(ACCOUNT_OF_ROLE.viewer);
    const list = await request(t.app).get('/api/scenarios')
      .set('Authorization', `Bearer ${token}`);
    expect(list.body.items.map((s: ScenarioDto) => s.name)).toEqual(['Czech outage']);
    const admin = `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE.admin)}`;
    const replaced = await request(t.app).put(`/api/scenarios/${scenario.id}`)
      .set('Authorization', admin).send({ name: 'Czech and S-1-001', countries: ['CZ'],
        suppliers: ['S-1-001'] });
    expect(replaced.status).toBe(200);
    expect(replaced.body).toMatchObject({ name: 'Czech and S-1-001', suppliers: ['S-1-001'],
      description: null });
    const removed = await request(t.app).delete(`/api/scenarios/${scenario.id}`)
      .set('Authorization', admin);
    expect(removed.status).toBe(204);
    expect((await request(t.app).delete(`/api/scenarios/${scenario.id}`)
      .set('Authorization', admin)).status).toBe(404);
  });

  it('refuses a name in use with 409', async () => {
    expect((await postAs(t, '/api/scenarios', { name: 'Twice' })).status).toBe(201);
    const again = await postAs(t, '/api/scenarios', { name: 'Twice' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('scenario_name_taken');
    const other = (await postAs(t, '/api/scenarios', { name: 'Once' })).body as ScenarioDto;
    const clash = await request(t.app).put(`/api/scenarios/${other.id}`)
      .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE.risk_manager)}`)
      .send({ name: 'Twice' });
    expect(clash.status).toBe(409);
  });

  it.each<Role>(['buyer', 'viewer', 'plant_manager'])('refuses saving to a %s', async (role) => {
    expect((await postAs(t, '/api/scenarios', { name: `By ${role}` }, role)).status).toBe(403);
  });

  it('names the field of a bad body', async () => {
    const response = await postAs(t, '/api/scenarios', { name: '', countries: 'CZ' });
    expect(response.status).toBe(400);
    const paths = response.body.error.details.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['body.name', 'body.countries']));
  });
});

describe('NetworkGraphCache', () => {
  it('keeps the two most recently used versions and builds a dropped one again', () => {
    const second = insertTestVersion(t.database.db, smallNetwork(), { label: 'Small A' });
    const third = insertTestVersion(t.database.db, smallNetwork(), { label: 'Small B' });
    const cache = new NetworkGraphCache(t.database.db, 2);
    const first = cache.get(1);
    expect(cache.get(1)).toBe(first);
    cache.get(second);
    cache.get(1);
    cache.get(third);
    // Version `second` was the least recently used when `third` came in.
    expect(cache.versionIds).toEqual([1, third]);
    expect(cache.get(1)).toBe(first);
    const rebuilt = cache.get(second);
    expect(rebuilt.graph.supplierCodes).toEqual(smallNetwork().suppliers.map((s) => s.code)
      .sort());
    expect(cache.versionIds).toEqual([1, second]);
    expect(() => cache.get(99)).toThrow(/no network version 99/);
  });
});
