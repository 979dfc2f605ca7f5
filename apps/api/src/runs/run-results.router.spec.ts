/**
 * A succeeded run's results on the demo network. The reference is `analyse()` of
 * `@keelson/supply-graph` on `readWorkbook` of `data/demo/keelson-demo.xlsx`, exactly what
 * `npm run analyze` (tools/analyze.ts) runs on that file; the rank order, every sort, filter,
 * heat-map count and Pareto share is recomputed here from the full list of rows.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  RUN_SUPPLIER_SORT_FIELDS,
  type HeatMapDto,
  type ParetoDto,
  type RunSupplierDetailDto,
  type RunSupplierDto,
} from '@keelson/contracts';
import { analyse, type AnalysisResult } from '@keelson/supply-graph';
import { createTestApp, type TestApp } from '../testing/test-app';
import { demoModel, getAs, runToEnd } from './run-spec-helpers';

let t: TestApp;
let runId: number;
let reference: AnalysisResult;
let rows: RunSupplierDto[];

const SPEC_FIELDS = ['code', 'name', 'country', 'region', 'tier', 'productsLost',
  'revenueExposedPerWeek', 'revenueImpact', 'timeToRecover', 'singlePointOfFailure',
  'betweenness', 'degree', 'closeness', 'eigenvector', 'pagerank', 'nexusIndex'] as const;

beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  reference = analyse(await demoModel());
  runId = (await runToEnd(t)).id;
  rows = (await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000`)).body.items;
}, 60_000);
afterAll(() => t.close());

const codeOrder = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const byRank = (a: { revenueImpact: number; productsLost: string[]; code: string },
  b: { revenueImpact: number; productsLost: string[]; code: string }) =>
  b.revenueImpact - a.revenueImpact || b.productsLost.length - a.productsLost.length ||
  codeOrder(a.code, b.code);
const codes = (items: { code: string }[]) => items.map((item) => item.code);

describe('the ranking against npm run analyze on the demo workbook', () => {
  it('has every supplier with the same values, field by field, in rank order', () => {
    const expected = [...reference.suppliers].sort(byRank);
    expect(rows).toHaveLength(148);
    rows.forEach((row, index) => {
      const want = expected[index]!;
      expect(row.rank).toBe(index + 1);
      for (const field of SPEC_FIELDS) expect([row.code, field, row[field]])
        .toEqual([want.code, field, want[field]]);
      const plants = [...new Set(want.products.map((p) => p.plantCode))].sort();
      expect(row.plants).toEqual(plants);
    });
  });
  it('equals the JSON that the analyser command itself writes, field by field', () => {
    // The real command, as a user runs it: npm run analyze -- <workbook> --json <file>.
    const root = join(import.meta.dirname, '..', '..', '..', '..');
    const out = join(mkdtempSync(join(tmpdir(), 'keelson-run-vs-cli-')), 'demo.json');
    const run = spawnSync(process.execPath, ['--import', 'tsx', 'tools/analyze.ts',
      'data/demo/keelson-demo.xlsx', '--json', out], { cwd: root, encoding: 'utf8',
      timeout: 120_000 });
    expect(run.status).toBe(0);
    const cli = JSON.parse(readFileSync(out, 'utf8')) as { suppliers: Record<string, unknown>[] };
    const byCode = new Map(rows.map((row) => [row.code, row]));
    expect(cli.suppliers.map((s) => s['code'])).toEqual([...byCode.keys()].sort(codeOrder));
    for (const want of cli.suppliers) {
      const row = byCode.get(want['code'] as string)!;
      for (const field of SPEC_FIELDS) {
        expect([row.code, field, row[field]]).toEqual([row.code, field, want[field]]);
      }
    }
  }, 120_000);
  it('scores each supplier: rating = impact band x likelihood, banded as spec 7 says', () => {
    const yearly = reference.totals.totalWeeklyRevenue * 52;
    for (const row of rows) {
      expect(row.rating).toBe(row.impactBand * row.likelihood);
      const share = row.revenueImpact / yearly;
      const band = share < 0.001 ? 1 : share < 0.005 ? 2 : share < 0.02 ? 3 : share < 0.05 ? 4
        : 5;
      expect([row.code, row.impactBand]).toEqual([row.code, band]);
      const ratingBand = row.rating >= 20 ? 'critical' : row.rating >= 10 ? 'high'
        : row.rating >= 5 ? 'medium' : 'low';
      expect(row.ratingBand).toBe(ratingBand);
    }
  });
});

describe('sorting', () => {
  const valueOf = (row: RunSupplierDto, field: (typeof RUN_SUPPLIER_SORT_FIELDS)[number]) =>
    field === 'productsLost' ? row.productsLost.length : row[field];
  for (const field of RUN_SUPPLIER_SORT_FIELDS) {
    for (const order of ['asc', 'desc'] as const) {
      it(`sorts by ${field} ${order}, ties by rank, empty tiers last`, async () => {
        const response = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000` +
          `&sort=${field}&order=${order}`);
        expect(response.status).toBe(200);
        const sign = order === 'asc' ? 1 : -1;
        const expected = [...rows].sort((a, b) => {
          const x = valueOf(a, field);
          const y = valueOf(b, field);
          if (x === null || y === null) return (x === null ? 1 : 0) - (y === null ? 1 : 0) ||
            a.rank - b.rank;
          const compared = typeof x === 'string' ? codeOrder(x, y as string)
            : x - (y as number);
          return sign * compared || a.rank - b.rank;
        });
        expect(codes(response.body.items)).toEqual(codes(expected));
      });
    }
  }
  it('pages without overlap', async () => {
    const first = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=10&sort=tier`);
    const second = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=10&offset=10` +
      '&sort=tier');
    expect(first.body.total).toBe(148);
    const all = [...codes(first.body.items), ...codes(second.body.items)];
    expect(new Set(all).size).toBe(20);
  });
  it('names the bad sort field', async () => {
    const response = await getAs(t, `/api/analysis-runs/${runId}/suppliers?sort=colour`);
    expect(response.status).toBe(400);
    expect(response.body.error.details.issues[0].path).toBe('query.sort');
  });
});

describe('filters', () => {
  const cases: [string, (row: RunSupplierDto) => boolean][] = [
    ['q=shared', (r) => /shared/i.test(r.code) || /shared/i.test(r.name)],
    ['plant=P-NORTH', (r) => r.plants.includes('P-NORTH')],
    ['tier=2', (r) => r.tier === 2],
    ['country=CZ', (r) => r.country === 'CZ'],
    ['ratingBand=medium', (r) => r.ratingBand === 'medium'],
    ['singlePointsOnly=true', (r) => r.singlePointOfFailure],
    ['singlePointsOnly=false', () => true],
  ];
  it.each(cases)('%s keeps exactly the matching rows', async (filter, keep) => {
    const response = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000&${filter}`);
    expect(response.status).toBe(200);
    const expected = rows.filter(keep);
    expect(codes(response.body.items)).toEqual(codes(expected));
    expect(response.body.total).toBe(expected.length);
  });
  it('filters by region and by a heat-map cell', async () => {
    const sample = rows.find((r) => r.singlePointOfFailure)!;
    const region = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000` +
      `&region=${encodeURIComponent(sample.region)}`);
    expect(codes(region.body.items)).toEqual(codes(rows.filter((r) => r.region === sample.region)));
    const cell = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000` +
      `&likelihood=${sample.likelihood}&impactBand=${sample.impactBand}`);
    expect(codes(cell.body.items)).toEqual(codes(rows.filter((r) =>
      r.likelihood === sample.likelihood && r.impactBand === sample.impactBand)));
    expect(codes(cell.body.items)).toContain(sample.code);
  });
});

describe('plant managers', () => {
  it('see only rows touching their plants, and get 403 for another plant', async () => {
    const own = await getAs(t, `/api/analysis-runs/${runId}/suppliers?limit=1000`,
      'plant_manager');
    const north = rows.filter((r) => r.plants.includes('P-NORTH'));
    expect(north.length).toBeGreaterThan(0);
    expect(codes(own.body.items)).toEqual(codes(north));
    const other = await getAs(t, `/api/analysis-runs/${runId}/suppliers?plant=P-SOUTH`,
      'plant_manager');
    expect(other.status).toBe(403);
    expect(other.body.error.code).toBe('plant_forbidden');
    const heat = (await getAs(t, `/api/analysis-runs/${runId}/heat-map`, 'plant_manager'))
      .body as HeatMapDto;
    expect(heat.total).toBe(north.length);
    const pareto = (await getAs(t, `/api/analysis-runs/${runId}/pareto`, 'plant_manager'))
      .body as ParetoDto;
    expect(codes(pareto.items).every((code) => codes(north).includes(code))).toBe(true);
  });
  it('see on a supplier page only the products and paths of their plants', async () => {
    const both = rows.find((r) => r.plants.includes('P-NORTH') && r.plants.length > 1)!;
    expect(both).toBeDefined();
    const detail = (await getAs(t, `/api/analysis-runs/${runId}/suppliers/${both.code}`,
      'plant_manager')).body as RunSupplierDetailDto;
    const want = reference.suppliers.find((s) => s.code === both.code)!.products
      .filter((p) => p.plantCode === 'P-NORTH');
    expect(detail.products).toEqual(want);
    expect(detail.failurePaths.map((p) => p.product)).toEqual(want.map((p) => p.code));
  });
  it('do not see the page of a supplier that touches none of their plants', async () => {
    const elsewhere = rows.find((r) => r.plants.length > 0 && !r.plants.includes('P-NORTH'))!;
    const response = await getAs(t, `/api/analysis-runs/${runId}/suppliers/${elsewhere.code}`,
      'plant_manager');
    expect(response.status).toBe(404);
    expect(response.body.error.message).toMatch(/does not touch your plants/);
  });
});

describe('heat map and Pareto', () => {
  it('counts every supplier once, in the cell of its likelihood and impact band', async () => {
    const heat = (await getAs(t, `/api/analysis-runs/${runId}/heat-map`)).body as HeatMapDto;
    const counted = Array.from({ length: 5 }, () => [0, 0, 0, 0, 0]);
    for (const row of rows) counted[row.likelihood - 1]![row.impactBand - 1]!++;
    expect(heat).toEqual({ cells: counted, total: 148 });
    expect(heat.cells.flat().reduce((a, b) => a + b, 0)).toBe(148);
  });
  it('lists suppliers by revenue impact with a running share that ends at 1', async () => {
    const pareto = (await getAs(t, `/api/analysis-runs/${runId}/pareto`)).body as ParetoDto;
    const total = rows.reduce((sum, r) => sum + r.revenueImpact, 0);
    expect(pareto.totalRevenueImpact).toBeCloseTo(total, 6);
    expect(pareto.items).toHaveLength(148);
    expect(codes(pareto.items)).toEqual(codes(rows));
    expect(pareto.items.at(-1)!.cumulativeShare).toBeCloseTo(1, 12);
    pareto.items.slice(1).forEach((item, i) =>
      expect(item.cumulativeShare).toBeGreaterThanOrEqual(pareto.items[i]!.cumulativeShare));
  });
});

describe('a supplier page', () => {
  it('has the products, one failure path per lost product, history and register entry',
    async () => {
      const response = await getAs(t, `/api/analysis-runs/${runId}/suppliers/S-2-SHARED-A`);
      expect(response.status).toBe(200);
      const detail = response.body as RunSupplierDetailDto;
      const want = reference.suppliers.find((s) => s.code === 'S-2-SHARED-A')!;
      expect(detail.products).toEqual(want.products);
      expect(detail.failurePaths.map((p) => p.product)).toEqual(want.productsLost);
      for (const path of detail.failurePaths) {
        expect(path.nodes[0]).toMatchObject({ kind: 'supplier', code: 'S-2-SHARED-A', tier: 2 });
        expect(path.nodes.at(-1)).toMatchObject({ kind: 'product', code: path.product,
          column: 0 });
      }
      expect(detail.history).toEqual([expect.objectContaining({ runId,
        revenueImpact: want.revenueImpact })]);
      const entry = t.database.sqlite.prepare('select id from register_entries where ' +
        "supplier_code = 'S-2-SHARED-A'").get() as { id: number };
      expect(detail.registerEntryId).toBe(entry.id);
    });
  it('answers 404 for a supplier that is not in the run', async () => {
    expect((await getAs(t, `/api/analysis-runs/${runId}/suppliers/NOPE`)).status).toBe(404);
  });
});

describe('export.xlsx', () => {
  it('has the ranking with a plain header and a sheet explaining the numbers', async () => {
    const response = await getAs(t, `/api/analysis-runs/${runId}/export.xlsx`)
      .buffer(true).parse((res, callback) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(response.status).toBe(200);
    const workbook = new ExcelJS.Workbook();
    const bytes = response.body as Buffer;
    await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
      bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const ranking = workbook.getWorksheet('Ranking')!;
    expect(ranking.getRow(1).getCell(1).value).toBe('Rank');
    expect(ranking.getRow(1).getCell(2).value).toBe('Supplier code');
    expect(ranking.rowCount).toBe(149);
    expect(ranking.getRow(2).getCell(2).value).toBe(rows[0]!.code);
    const about = workbook.getWorksheet('About these numbers')!;
    const text = about.getSheetValues().flat().join(' ');
    expect(text).toMatch(/No re-allocation/);
    expect(text).toMatch(/procedures decide/);
  });

  it('holds what the ranking screen shows: its filters and its sort', async () => {
    const response = await getAs(t,
      `/api/analysis-runs/${runId}/export.xlsx?singlePointsOnly=true&sort=code&order=desc`)
      .buffer(true).parse((res, callback) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(response.status).toBe(200);
    const workbook = new ExcelJS.Workbook();
    const bytes = response.body as Buffer;
    await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
      bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const ranking = workbook.getWorksheet('Ranking')!;
    // Expected from the analysis itself: the single points of failure, codes descending.
    const expected = rows.filter((row) => row.singlePointOfFailure).map((row) => row.code)
      .sort().reverse();
    const codes = Array.from({ length: ranking.rowCount - 1 },
      (_, i) => ranking.getRow(i + 2).getCell(2).value);
    expect(codes).toEqual(expected);
    expect((await getAs(t, `/api/analysis-runs/${runId}/export.xlsx?sort=nope`)).status)
      .toBe(400);
  });
});
