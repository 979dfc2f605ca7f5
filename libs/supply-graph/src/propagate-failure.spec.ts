/** Failure propagation (spec section 3) on hand-drawn models; expectations read off the rules. */
import { describe, expect, it } from 'vitest';
import { buildSupplyGraph } from './build-supply-graph';
import { UnknownSupplierError } from './errors';
import { impactOf } from './impact';
import { propagateFailure } from './propagate-failure';
import { compactModel } from './testing/compact-model';

const cycle = buildSupplyGraph(
  compactModel({
    plants: ['P1'],
    products: [['F1', 'P1', 10], ['F2', 'P1', 20]],
    bom: [['F1', 'I1'], ['F2', 'I2']],
    suppliers: ['A', 'B', 'C', 'D', 'E'],
    sourcing: [
      ['P1', 'I1', 'A'],
      ['A', 'X', 'B'],
      ['B', 'Y', 'A'],
      ['P1', 'I2', 'C'],
      ['P1', 'I2', 'D'],
      ['C', 'Z', 'E'],
    ],
  }),
);
const isDown = (down: Uint8Array, id: string) => down[cycle.indexOf.get(id)!] === 1;

describe('propagateFailure', () => {
  it('keeps a supplier cycle that no failure reaches up (least fixed point)', () => {
    const down = propagateFailure(cycle, []);
    expect(isDown(down, 'supplier:A')).toBe(false);
    expect(isDown(down, 'supplier:B')).toBe(false);
    expect(isDown(down, 'product:F1')).toBe(false);
  });
  it('takes the whole cycle down when one member fails', () => {
    const down = propagateFailure(cycle, ['B']);
    expect(isDown(down, 'supplier:A')).toBe(true);
    expect(isDown(down, 'item:Y@B')).toBe(true);
    expect(isDown(down, 'product:F1')).toBe(true);
    expect(isDown(down, 'product:F2')).toBe(false);
  });
  it('keeps a dual-sourced item up while one source is up, and down when both are', () => {
    expect(isDown(propagateFailure(cycle, ['C']), 'item:I2@P1')).toBe(false);
    expect(isDown(propagateFailure(cycle, ['E']), 'supplier:C')).toBe(true);
    expect(isDown(propagateFailure(cycle, ['E']), 'item:I2@P1')).toBe(false);
    expect(isDown(propagateFailure(cycle, ['E', 'D']), 'product:F2')).toBe(true);
  });
  it('never marks a plant down (the contract gives plants no state)', () => {
    expect(isDown(propagateFailure(cycle, ['A', 'C', 'D']), 'plant:P1')).toBe(false);
  });
  it('throws UnknownSupplierError listing every unknown code once', () => {
    const run = () => propagateFailure(cycle, ['A', 'Q1', 'Q2', 'Q1']);
    expect(run).toThrow(UnknownSupplierError);
    expect(run).toThrow('Unknown supplier codes in the failure set: "Q1", "Q2"');
    try {
      run();
    } catch (error) {
      expect((error as UnknownSupplierError).codes).toEqual(['Q1', 'Q2']);
    }
  });
});

describe('impactOf', () => {
  const graph = buildSupplyGraph(
    compactModel({
      plants: ['P1'],
      products: [['F1', 'P1', 1000], ['F2', 'P1', 500], ['F0', 'P1', 50]],
      bom: [['F1', 'M'], ['M', 'I1'], ['M', 'I2'], ['F2', 'I2'], ['F0', 'I3'], ['F0', 'I2']],
      suppliers: [['S1', 6], ['S2', 10]],
      sourcing: [['P1', 'I1', 'S1'], ['P1', 'I2', 'S1'], ['P1', 'I2', 'S2']],
      stock: [['P1', 'I1', 2], ['P1', 'I2', 1.5], ['P1', 'M', 20]],
    }),
  );

  it('subtracts the baseline, takes TTS over down bought items and TTR of the set', () => {
    // F0 is down at baseline (I3 unsourced), so it is never lost. S1 alone: I1 down (cover 2),
    // I2 still up through S2: F1 lost with TTS 2, lost weeks 6 - 2 = 4. Hand computation.
    expect(impactOf(graph, ['S1'])).toEqual({
      failed: ['S1'],
      productsLost: ['F1'],
      revenueExposedPerWeek: 1000,
      revenueImpact: 4000,
      timeToRecover: 6,
      products: [
        { code: 'F1', plantCode: 'P1', weeklyRevenue: 1000, timeToSurvive: 2, lostWeeks: 4 },
      ],
    });
  });
  it('uses the largest recovery and the smallest down cover for a set', () => {
    // S1 + S2: I1 and I2 down; F1 TTS min(2, 1.5) = 1.5 (M's 20 weeks ignored), F2 1.5; TTR 10.
    const impact = impactOf(graph, ['S2', 'S1', 'S2']);
    expect(impact.failed).toEqual(['S1', 'S2']);
    expect(impact.timeToRecover).toBe(10);
    expect(impact.products.map((p) => [p.code, p.timeToSurvive, p.lostWeeks])).toEqual([
      ['F1', 1.5, 8.5],
      ['F2', 1.5, 8.5],
    ]);
    expect(impact.revenueImpact).toBe(1000 * 8.5 + 500 * 8.5);
  });
  it('has zero time to recover and no loss for the empty set', () => {
    expect(impactOf(graph, [])).toMatchObject({
      productsLost: [],
      timeToRecover: 0,
      revenueImpact: 0,
    });
  });
});
