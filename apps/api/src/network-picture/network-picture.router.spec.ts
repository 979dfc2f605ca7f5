/**
 * GET /api/network-versions/:id/picture. References: the small hand-made network of
 * network-test-versions.ts, whose graph (19 nodes, 20 edges), layers, plant scope and grouped
 * form are worked out by hand in the comments below from spec section 2; a generated network
 * above the grouping threshold, checked against counts taken from its own model.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RUN_NOT_READY, type Role } from '@keelson/contracts';
import { analysisRuns, runSuppliers } from '@keelson/db';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import {
  generatedNetwork,
  insertTestVersion,
  smallNetwork,
} from '../network/network-test-versions';
import type { NetworkPictureDto, NetworkPictureNodeDto } from './network-picture-dto';

let t: TestApp;
let small: number;
let big: number;
let run: number;
let runningRun: number;
const bigModel = generatedNetwork(5, 400);

function insertRun(version: number, status: 'succeeded' | 'running'): number {
  return t.database.db.insert(analysisRuns).values({
    networkVersionId: version, label: `Run ${status}`, status, createdAt: '2026-03-02T08:30:00Z',
  }).returning({ id: analysisRuns.id }).get().id;
}

function runRow(runId: number, code: string, isSingle: boolean, impact: number, plants: string[]) {
  return {
    runId, code, name: code, country: 'XX', region: 'R', tier: 1, rank: 1, productsLost: [],
    productsLostCount: 0, plants, revenueExposedPerWeek: 0, revenueImpact: impact,
    timeToRecover: 4, singlePointOfFailure: isSingle, betweenness: 0, degree: 0, closeness: 0,
    eigenvector: 0, pagerank: 0, nexusIndex: 0, products: [], likelihood: 1,
    likelihoodFactors: {}, impactBand: 1, rating: 1, ratingBand: 'low' as const,
  };
}

beforeAll(async () => {
  t = await createTestApp();
  small = insertTestVersion(t.database.db, smallNetwork(), { fileName: 'small.xlsx' });
  big = insertTestVersion(t.database.db, bigModel, { fileName: 'big.xlsx' });
  run = insertRun(small, 'succeeded');
  runningRun = insertRun(small, 'running');
  // S2 and S3 stop P-NORTH products, S5 and S4 only P-SOUTH ones (invented run results).
  t.database.db.insert(runSuppliers).values([
    runRow(run, 'S2', true, 120_000, ['P-NORTH']),
    runRow(run, 'S3', false, 40_000, ['P-NORTH', 'P-SOUTH']),
    runRow(run, 'S4', true, 60_000, ['P-SOUTH']),
    runRow(run, 'S5', true, 50_000, ['P-SOUTH']),
  ]).run();
});
afterAll(() => t.close());

function get(path: string, role: Role = 'buyer') {
  return request(t.app)
    .get(path)
    .set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`);
}

async function picture(query = '', role: Role = 'buyer', version = small) {
  const response = await get(`/api/network-versions/${version}/picture${query}`, role);
  expect(response.status, response.text).toBe(200);
  return response.body as NetworkPictureDto;
}

const byId = (nodes: NetworkPictureNodeDto[]) => new Map(nodes.map((n) => [n.id, n]));
const edgeKeys = (body: NetworkPictureDto) =>
  body.edges.map((e) => `${e.source} > ${e.target}${e.count ? ` x${e.count}` : ''}`).sort();

// The 20 qualified edges of the small network: supplier -> item, supplier item -> its buyer,
// BOM child -> parent at each plant, product -> plant (S3's I1 row is unqualified: no edge).
const SMALL_EDGES = [
  'supplier:S1 > item:I1@P-NORTH', 'supplier:S2 > item:I2@P-NORTH',
  'supplier:S3 > item:I2@P-NORTH', 'supplier:S2 > item:I3@P-NORTH',
  'supplier:S3 > item:I2@P-SOUTH', 'supplier:S5 > item:I4@P-SOUTH',
  'supplier:S4 > item:C1@S2', 'supplier:S4 > item:C2@S5', 'item:C1@S2 > supplier:S2',
  'item:C2@S5 > supplier:S5', 'item:A1@P-NORTH > product:F1', 'item:I3@P-NORTH > product:F1',
  'item:I1@P-NORTH > item:A1@P-NORTH', 'item:I2@P-NORTH > item:A1@P-NORTH',
  'item:I2@P-NORTH > product:F2', 'item:I2@P-SOUTH > product:F3',
  'item:I4@P-SOUTH > product:F3', 'product:F1 > plant:P-NORTH', 'product:F2 > plant:P-NORTH',
  'product:F3 > plant:P-SOUTH',
];

describe('GET /api/network-versions/:id/picture', () => {
  it('draws every node and qualified edge, with layers counted from the plants', async () => {
    const body = await picture();
    expect(body).toMatchObject({ networkVersionId: small, runId: null, mode: 'full',
      totalNodes: 19, totalEdges: 20, singlePoints: 0 });
    expect(edgeKeys(body)).toEqual([...SMALL_EDGES].sort());
    // Fewest hops to a plant: F* 1; their parts 2; I1 (inside A1) and S2, S3, S5 3; S1 and the
    // supplier items 4; S4 5; S6 reaches no plant and goes one beyond the deepest (6).
    const columns = Object.fromEntries(body.nodes.map((n) => [n.id, n.column]));
    expect(columns).toEqual({
      'plant:P-NORTH': 0, 'plant:P-SOUTH': 0, 'product:F1': 1, 'product:F2': 1, 'product:F3': 1,
      'item:A1@P-NORTH': 2, 'item:I2@P-NORTH': 2, 'item:I3@P-NORTH': 2, 'item:I2@P-SOUTH': 2,
      'item:I4@P-SOUTH': 2, 'item:I1@P-NORTH': 3, 'supplier:S2': 3, 'supplier:S3': 3,
      'supplier:S5': 3, 'supplier:S1': 4, 'item:C1@S2': 4, 'item:C2@S5': 4, 'supplier:S4': 5,
      'supplier:S6': 6,
    });
    const nodes = byId(body.nodes);
    expect(nodes.get('supplier:S4')).toEqual({ id: 'supplier:S4', kind: 'supplier', code: 'S4',
      label: 'Deep Tier Alloys', tier: 2, column: 5, isSinglePoint: false, revenueImpact: null });
    expect(nodes.get('supplier:S6')?.tier).toBeNull();
    expect(nodes.get('item:C1@S2')).toMatchObject({ kind: 'item', label: 'C1 at S2', tier: null });
    expect(nodes.get('plant:P-NORTH')?.label).toBe('Varnholm Works');
    expect(nodes.get('product:F3')?.label).toBe('Gear unit');
  });

  it('gives a plant manager only what belongs to or supplies their plants', async () => {
    const body = await picture('', 'plant_manager');
    // P-NORTH, F1, F2, its four items, then upstream S1, S2, S3, S4 and C1 at S2.
    expect(body.nodes.map((n) => n.id).sort()).toEqual([
      'item:A1@P-NORTH', 'item:C1@S2', 'item:I1@P-NORTH', 'item:I2@P-NORTH', 'item:I3@P-NORTH',
      'plant:P-NORTH', 'product:F1', 'product:F2', 'supplier:S1', 'supplier:S2', 'supplier:S3',
      'supplier:S4',
    ]);
    const visible = new Set(body.nodes.map((n) => n.id));
    const expected = SMALL_EDGES.filter((key) => key.split(' > ').every((id) => visible.has(id)));
    expect(expected).toHaveLength(13);
    expect(edgeKeys(body)).toEqual(expected.sort());
    expect(body).toMatchObject({ totalNodes: 12, totalEdges: 13 });
  });

  it('marks the single points of failure and revenue impact of a run', async () => {
    const body = await picture(`?runId=${run}`);
    const nodes = byId(body.nodes);
    expect(body).toMatchObject({ runId: run, singlePoints: 3 });
    expect(nodes.get('supplier:S2')).toMatchObject({ isSinglePoint: true, revenueImpact: 120_000 });
    expect(nodes.get('supplier:S3')).toMatchObject({ isSinglePoint: false, revenueImpact: 40_000 });
    expect(nodes.get('supplier:S1')).toMatchObject({ isSinglePoint: false, revenueImpact: null });
    expect(nodes.get('product:F1')?.revenueImpact).toBeNull();
  });

  it('shows a plant manager only the run marks that touch their plants', async () => {
    const nodes = byId((await picture(`?runId=${run}`, 'plant_manager')).nodes);
    expect(nodes.get('supplier:S2')).toMatchObject({ isSinglePoint: true, revenueImpact: 120_000 });
    // S4 supplies P-NORTH, but the run found it a single point for P-SOUTH only.
    expect(nodes.get('supplier:S4')).toMatchObject({ isSinglePoint: false, revenueImpact: null });
  });

  it('groups suppliers by tier and country and folds items into counted edges', async () => {
    const body = await picture(`?runId=${run}&mode=aggregated`);
    expect(body).toMatchObject({ mode: 'aggregated', totalNodes: 19, singlePoints: 3 });
    const groups = body.nodes.filter((n) => n.kind === 'supplierGroup');
    expect(groups.map((g) => [g.id, g.count, g.singlePoints, g.column, g.revenueImpact])).toEqual([
      ['group:1:CN', 2, 1, 2, 160_000], ['group:1:DE', 1, 0, 2, 0],
      ['group:1:MX', 1, 1, 2, 50_000], ['group:2:TW', 1, 1, 3, 60_000],
      ['group:none:US', 1, 0, 4, 0],
    ]);
    expect(body.nodes.filter((n) => n.kind === 'item')).toEqual([]);
    expect(groups.find((g) => g.id === 'group:2:TW')?.label).toBe('Tier 2 · TW');
    // Links through items: S1 reaches F1; S2 F1, F2; S3 F1, F2, F3; S5 F3; S4 S2 and S5.
    expect(edgeKeys(body)).toEqual([
      'group:1:CN > product:F1 x2', 'group:1:CN > product:F2 x2', 'group:1:CN > product:F3 x1',
      'group:1:DE > product:F1 x1', 'group:1:MX > product:F3 x1', 'group:2:TW > group:1:CN x1',
      'group:2:TW > group:1:MX x1', 'product:F1 > plant:P-NORTH x1',
      'product:F2 > plant:P-NORTH x1', 'product:F3 > plant:P-SOUTH x1',
    ]);
  });

  it('answers the grouped form by itself above 3 000 nodes', async () => {
    const body = await picture('', 'viewer', big);
    expect(body.totalNodes).toBeGreaterThan(3000);
    expect(body.mode).toBe('aggregated');
    const groups = body.nodes.filter((n) => n.kind === 'supplierGroup');
    expect(groups.reduce((sum, g) => sum + g.count!, 0)).toBe(bigModel.suppliers.length);
    expect(new Set(groups.map((g) => g.code))).toEqual(
      new Set(bigModel.suppliers.map((s) => s.country)));
    expect(body.nodes.filter((n) => n.kind === 'product')).toHaveLength(bigModel.products.length);
    const ids = new Set(body.nodes.map((n) => n.id));
    expect(body.edges.every((e) => ids.has(e.source) && ids.has(e.target))).toBe(true);
  });

  it('names what is wrong with a bad request', async () => {
    const bad = await get(`/api/network-versions/${small}/picture?runId=abc`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('query.runId');
    const missing = await get('/api/network-versions/999/picture');
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toContain('999');
    const noRun = await get(`/api/network-versions/${small}/picture?runId=999`);
    expect(noRun.status).toBe(404);
    const otherVersion = await get(`/api/network-versions/${big}/picture?runId=${run}`);
    expect(otherVersion.status).toBe(400);
    expect(otherVersion.body.error.message).toContain(`query.runId: run ${run}`);
    const running = await get(`/api/network-versions/${small}/picture?runId=${runningRun}`);
    expect(running.status).toBe(409);
    expect(running.body.error.code).toBe(RUN_NOT_READY);
    const signedOut = await request(t.app).get(`/api/network-versions/${small}/picture`);
    expect(signedOut.status).toBe(401);
  });
});
