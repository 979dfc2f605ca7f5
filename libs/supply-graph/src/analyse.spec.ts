/**
 * `analyse()` against the worked example computed by hand in docs/methods.md
 * (WORKED_EXAMPLE_EXPECTED holds that hand computation), plus the scenario rules of spec 8.15,
 * errors, progress and cancellation.
 */
import { describe, expect, it } from 'vitest';
import { analyse } from './analyse';
import { AnalysisCancelledError, UnknownSupplierError } from './errors';
import { generateTieredNetwork } from './testing/generate-tiered-network';
import { WORKED_EXAMPLE, WORKED_EXAMPLE_EXPECTED } from './testing/worked-example';

const revenue: Record<string, number> = { F1: 50_000, F2: 30_000, F3: 20_000, F4: 10_000 };
const plant: Record<string, string> = { F1: 'P1', F2: 'P1', F3: 'P2', F4: 'P2' };

describe('analyse on the worked example (hand computation, docs/methods.md)', () => {
  const result = analyse(WORKED_EXAMPLE, { failCountry: ' cn ' });

  it.each(WORKED_EXAMPLE_EXPECTED.suppliers)('supplier $code matches the hand count', (row) => {
    const supplier = result.suppliers.find((s) => s.code === row.code)!;
    expect(supplier).toMatchObject({
      tier: row.tier,
      timeToRecover: row.timeToRecover,
      productsLost: row.products.map((p) => p.code),
      revenueExposedPerWeek: row.revenueExposedPerWeek,
      revenueImpact: row.revenueImpact,
      singlePointOfFailure: row.products.length > 0,
      betweenness: row.betweenness,
    });
    expect(supplier.products).toEqual(
      row.products.map((p) => ({ ...p, plantCode: plant[p.code], weeklyRevenue: revenue[p.code] })),
    );
  });
  it('lists suppliers in code order with the contract fields and extras', () => {
    expect(result.suppliers.map((s) => s.code)).toEqual(
      ['S1', 'S2', 'S3', 'S4', 'S5', 'S6', 'S7', 'S8', 'S9'],
    );
    expect(Object.keys(result.suppliers[0]!)).toEqual(
      expect.arrayContaining([
        'code', 'tier', 'productsLost', 'revenueExposedPerWeek', 'revenueImpact',
        'singlePointOfFailure', 'betweenness', 'degree', 'closeness', 'eigenvector', 'pagerank',
        'name', 'country', 'region', 'nexusIndex', 'timeToRecover', 'products',
      ]),
    );
  });
  it('fails every supplier of the trimmed, case-insensitive country in the scenario', () => {
    const expected = WORKED_EXAMPLE_EXPECTED.scenarioCn;
    expect(result.scenario).toEqual({
      failed: expected.failed,
      productsLost: expected.products.map((p) => p.code),
      revenueExposedPerWeek: expected.revenueExposedPerWeek,
      revenueImpact: expected.revenueImpact,
      timeToRecover: expected.timeToRecover,
      products: expected.products.map((p) => ({
        ...p,
        plantCode: plant[p.code],
        weeklyRevenue: revenue[p.code],
      })),
    });
  });
  it('gives totals, the baseline products and timings per stage', () => {
    expect(result.totals).toMatchObject({
      suppliers: 9,
      plants: 2,
      products: 4,
      totalWeeklyRevenue: 110_000,
      singlePointsOfFailure: 6,
      productsDownAtBaseline: WORKED_EXAMPLE_EXPECTED.productsDownAtBaseline,
    });
    expect(result.timings.total).toBeGreaterThan(0);
    expect(Object.keys(result.timings)).toContain('single removals');
  });
  it('ranks the hidden shared tier-2 supplier first by revenue impact', () => {
    const top = [...result.suppliers].sort((a, b) => b.revenueImpact - a.revenueImpact)[0]!;
    expect(top.code).toBe('S4');
    expect(top.tier).toBe(2);
  });
  it('keeps nexus indices in [0, 1] and gives the unused supplier S9 zero', () => {
    for (const s of result.suppliers) {
      expect(s.nexusIndex).toBeGreaterThanOrEqual(0);
      expect(s.nexusIndex).toBeLessThanOrEqual(1);
    }
    expect(result.suppliers.find((s) => s.code === 'S9')!.nexusIndex).toBe(0);
  });
});

describe('analyse scenarios and errors', () => {
  it('omits the scenario when no failure set is named', () => {
    expect(analyse(WORKED_EXAMPLE).scenario).toBeUndefined();
  });
  it('takes the union of fail and failCountry, sorted and without repeats', () => {
    const result = analyse(WORKED_EXAMPLE, { fail: ['S8', 'S2'], failCountry: 'CN' });
    expect(result.scenario!.failed).toEqual(['S2', 'S3', 'S8']);
    expect(result.scenario!.productsLost).toEqual(['F1', 'F2', 'F3']);
  });
  it('gives an empty scenario for a country with no suppliers', () => {
    expect(analyse(WORKED_EXAMPLE, { failCountry: 'ZZ' }).scenario).toMatchObject({
      failed: [],
      productsLost: [],
      timeToRecover: 0,
    });
  });
  it('throws UnknownSupplierError listing the codes that are not suppliers', () => {
    const run = () => analyse(WORKED_EXAMPLE, { fail: ['S1', 'NOPE', 'P1'] });
    expect(run).toThrow(UnknownSupplierError);
    expect(run).toThrow(/"NOPE", "P1"/);
  });
  it('reports progress from 0 to 1 through the stages in order', () => {
    const events: Array<[number, string]> = [];
    analyse(generateTieredNetwork({ seed: 9, suppliers: 300 }), {
      onProgress: (fraction, stage) => events.push([fraction, stage]),
    });
    const fractions = events.map(([f]) => f);
    expect(fractions[0]).toBe(0);
    expect(fractions.at(-1)).toBe(1);
    fractions.slice(1).forEach((f, i) => expect(f).toBeGreaterThanOrEqual(fractions[i]! - 1e-12));
    expect(new Set(events.map(([, stage]) => stage))).toEqual(
      new Set(['graph', 'tiers', 'single removals', 'betweenness', 'closeness', 'degree',
        'eigenvector', 'pagerank', 'nexus index', 'scenario']),
    );
  });
  it('throws AnalysisCancelledError naming the stage when the signal is aborted', () => {
    const controller = new AbortController();
    let caught: unknown;
    try {
      analyse(generateTieredNetwork({ seed: 9, suppliers: 300 }), {
        signal: controller.signal,
        onProgress: (_, stage) => {
          if (stage === 'betweenness') controller.abort();
        },
      });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(AnalysisCancelledError);
    expect((caught as AnalysisCancelledError).stage).toBe('betweenness');
  });
  it('refuses to start with an already aborted signal', () => {
    expect(() => analyse(WORKED_EXAMPLE, { signal: { aborted: true } })).toThrow(/stage "graph"/);
  });
  it('does not mutate the model', () => {
    const copy = structuredClone(WORKED_EXAMPLE);
    analyse(WORKED_EXAMPLE, { fail: ['S1'] });
    expect(WORKED_EXAMPLE).toEqual(copy);
  });
});
