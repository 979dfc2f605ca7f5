/**
 * The seeded generator: reproducible, valid for the import's own checks (`validateModel` of
 * `@keelson/workbook`, the colleague library that guards uploads), and shaped as asked.
 */
import { validateModel } from '@keelson/workbook';
import { describe, expect, it } from 'vitest';
import { buildSupplyGraph } from '../build-supply-graph';
import { condense } from '../condensation';
import { tiers } from '../tiers';
import { generateTieredNetwork } from './generate-tiered-network';
import { mulberry32 } from './mulberry32';
import { WORKED_EXAMPLE } from './worked-example';

describe('generateTieredNetwork', () => {
  it('gives the same model for the same seed and a different one for another seed', () => {
    const a = generateTieredNetwork({ seed: 42, suppliers: 300, cycles: 5 });
    expect(generateTieredNetwork({ seed: 42, suppliers: 300, cycles: 5 })).toEqual(a);
    expect(generateTieredNetwork({ seed: 43, suppliers: 300, cycles: 5 })).not.toEqual(a);
  });
  it.each([
    { seed: 1, suppliers: 50 },
    { seed: 2, suppliers: 400, cycles: 10, unsourcedShare: 0.1, unqualifiedShare: 0.2 },
    { seed: 3, suppliers: 5, tiers: 6, products: 1, plants: 2 },
    { seed: 4, suppliers: 1000, dualSourcedShare: 0.8, itemsPerLevel: [2, 2] },
  ])('produces a model without import errors: %o', (options) => {
    const { errors } = validateModel(generateTieredNetwork(options));
    expect(errors).toEqual([]);
  });
  it('makes about 20 graph edges per supplier by default', () => {
    const graph = buildSupplyGraph(generateTieredNetwork({ seed: 5, suppliers: 2000 }));
    expect(graph.edgeCount / 2000).toBeGreaterThan(16);
    expect(graph.edgeCount / 2000).toBeLessThan(24);
  });
  it('builds tiers 1..4 with every supplier sold somewhere', () => {
    const graph = buildSupplyGraph(generateTieredNetwork({ seed: 6, suppliers: 500, tiers: 4 }));
    const values = new Set(tiers(graph).values());
    expect(values).toEqual(new Set([1, 2, 3, 4]));
  });
  it('adds supplier cycles when asked (strongly connected components of several nodes)', () => {
    const cyclic = (cycles: number) => {
      const graph = buildSupplyGraph(generateTieredNetwork({ seed: 7, suppliers: 200, cycles }));
      return condense(graph).componentCount < graph.n;
    };
    expect(cyclic(0)).toBe(false);
    expect(cyclic(3)).toBe(true);
  });
  it('leaves unsourced parts when asked, so some products are down at baseline', () => {
    const model = generateTieredNetwork({ seed: 8, suppliers: 300, unsourcedShare: 0.5 });
    const graph = buildSupplyGraph(model);
    expect(graph.productNodes.some((node) => graph.baselineDown[node] === 1)).toBe(true);
  });
});

describe('mulberry32', () => {
  it('is reproducible and stays in [0, 1)', () => {
    const a = mulberry32(123);
    const b = mulberry32(123);
    const values = Array.from({ length: 1000 }, () => a());
    expect(values).toEqual(Array.from({ length: 1000 }, () => b()));
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...values)).toBeLessThan(1);
    expect(new Set(values).size).toBe(1000);
  });
});

describe('WORKED_EXAMPLE', () => {
  it('imports without errors; its warnings are the ones the example is built to show', () => {
    const { errors, warnings } = validateModel(WORKED_EXAMPLE);
    expect(errors).toEqual([]);
    expect(warnings.map((w) => w.kind).sort()).toEqual(['supplier-unused', 'unsourced']);
  });
});
