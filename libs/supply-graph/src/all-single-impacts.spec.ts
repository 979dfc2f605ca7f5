/**
 * Property tests (fast-check) of the bit-parallel single removals against the plain reference
 * implementation, on seeded generated networks and on unstructured random models with supplier
 * cycles, unqualified rows and unsourced items; plus two structural properties of the rules.
 */
import fc from 'fast-check';
import type { SupplyModel } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { allSingleImpacts } from './all-single-impacts';
import { buildSupplyGraph } from './build-supply-graph';
import { AnalysisCancelledError } from './errors';
import { impactOf } from './impact';
import { propagateFailure } from './propagate-failure';
import { compactModel } from './testing/compact-model';
import { generateTieredNetwork } from './testing/generate-tiered-network';

const generated = fc
  .record({
    seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
    suppliers: fc.integer({ min: 1, max: 120 }),
    plants: fc.integer({ min: 1, max: 3 }),
    products: fc.integer({ min: 1, max: 8 }),
    tiers: fc.integer({ min: 1, max: 5 }),
    dualSourcedShare: fc.double({ min: 0, max: 0.9, noNaN: true }),
    unqualifiedShare: fc.double({ min: 0, max: 0.4, noNaN: true }),
    unsourcedShare: fc.double({ min: 0, max: 0.3, noNaN: true }),
    cycles: fc.integer({ min: 0, max: 30 }),
    edgesPerSupplier: fc.integer({ min: 3, max: 25 }),
  })
  .map((options) => generateTieredNetwork(options));

/** Unstructured models: any supplier may buy from any other (many cycles, self-reinforcing). */
const unstructured = fc
  .record({
    suppliers: fc.integer({ min: 1, max: 40 }),
    parts: fc.integer({ min: 1, max: 8 }),
    rows: fc.array(
      fc.tuple(fc.nat(), fc.nat(), fc.nat(), fc.boolean(), fc.boolean()),
      { maxLength: 150 },
    ),
    bom: fc.array(fc.tuple(fc.nat(), fc.nat()), { minLength: 1, maxLength: 12 }),
    cover: fc.array(fc.integer({ min: 0, max: 12 }), { minLength: 8, maxLength: 8 }),
  })
  .map(({ suppliers, parts, rows, bom, cover }): SupplyModel => {
    const supplierCodes = Array.from({ length: suppliers }, (_, i) => `S${i}`);
    const partCodes = Array.from({ length: parts }, (_, i) => `I${i}`);
    const seen = new Set<string>();
    const sourcing: Array<[string, string, string, boolean]> = [];
    for (const [buyer, item, seller, toPlant, qualified] of rows) {
      const buyerCode = toPlant ? 'P1' : supplierCodes[buyer % suppliers]!;
      const itemCode = toPlant ? partCodes[item % parts]! : `C${item % 10}`;
      const supplierCode = supplierCodes[seller % suppliers]!;
      const row: [string, string, string, boolean] = [buyerCode, itemCode, supplierCode, qualified];
      const key = row.slice(0, 3).join('|');
      if (!seen.has(key)) sourcing.push(row);
      seen.add(key);
    }
    const bomLines = new Set(
      bom.map(([product, part]) => `F${product % 3}|${partCodes[part % parts]}`),
    );
    return compactModel({
      plants: ['P1'],
      products: [['F0', 'P1', 100], ['F1', 'P1', 250], ['F2', 'P1', 75]],
      bom: [...bomLines].map((line) => line.split('|') as [string, string]),
      suppliers: supplierCodes.map((code, i) => [code, 1 + (i % 9)] as [string, number]),
      sourcing,
      stock: partCodes.map((code, i) => ['P1', code, cover[i]!] as [string, string, number]),
    });
  });

function expectBitParallelEqualsReference(model: SupplyModel): void {
  const graph = buildSupplyGraph(model);
  const all = allSingleImpacts(graph);
  expect(all.map((impact) => impact.supplierCode)).toEqual(graph.supplierCodes);
  all.forEach(({ supplierCode, ...impact }) => {
    expect(impact).toEqual(impactOf(graph, [supplierCode]));
  });
}

describe('allSingleImpacts', () => {
  it('equals impactOf(graph, [s]) for every supplier of generated tiered networks', () => {
    fc.assert(fc.property(generated, expectBitParallelEqualsReference), { numRuns: 60 });
  });
  it('equals impactOf(graph, [s]) on unstructured models with cycles and unsourced items', () => {
    fc.assert(fc.property(unstructured, expectBitParallelEqualsReference), { numRuns: 150 });
  });
  it('handles more than 32 suppliers in one strongly connected ring', () => {
    // S0 <- S1 <- ... <- S69 <- S0: one SCC spanning three passes; every failure loses F1.
    const codes = Array.from({ length: 70 }, (_, i) => `S${i}`);
    const model = compactModel({
      plants: ['P1'],
      products: [['F1', 'P1', 10]],
      bom: [['F1', 'I1']],
      suppliers: codes,
      sourcing: [
        ['P1', 'I1', 'S0'],
        ...codes.map(
          (code, i) => [code, 'R', codes[(i + 1) % codes.length]!] as [string, string, string],
        ),
      ],
    });
    const all = allSingleImpacts(buildSupplyGraph(model));
    expect(all.every((impact) => impact.productsLost.join() === 'F1')).toBe(true);
    expectBitParallelEqualsReference(model);
  });
  it('reports progress up to 1 and stops with AnalysisCancelledError when aborted', () => {
    const graph = buildSupplyGraph(generateTieredNetwork({ seed: 3, suppliers: 200 }));
    const fractions: number[] = [];
    allSingleImpacts(graph, { onProgress: (f) => fractions.push(f) });
    expect(fractions).toHaveLength(Math.ceil(200 / 32));
    expect(fractions.at(-1)).toBe(1);
    expect([...fractions].sort((a, b) => a - b)).toEqual(fractions);
    const signal = { aborted: false };
    const run = () =>
      allSingleImpacts(graph, { signal, onProgress: (f) => (signal.aborted = f > 0.3) });
    expect(run).toThrow(AnalysisCancelledError);
  });
});

describe('properties of the failure rules', () => {
  it('adding a qualified source never increases down sets or products lost', () => {
    const withChoice = fc.tuple(
      generated.filter((model) => model.sourcing.some((row) => row.isQualified)),
      fc.nat(),
      fc.nat(),
    );
    fc.assert(
      fc.property(withChoice, ([model, rowPick, supplierPick]) => {
        const qualified = model.sourcing.filter((row) => row.isQualified);
        const row = qualified[rowPick % qualified.length]!;
        const taken = new Set(
          model.sourcing
            .filter((r) => r.buyerCode === row.buyerCode && r.itemCode === row.itemCode)
            .map((r) => r.supplierCode),
        );
        const choices = model.suppliers.filter(
          (s) => !taken.has(s.code) && s.code !== row.buyerCode,
        );
        fc.pre(choices.length > 0);
        const extra = { ...row, supplierCode: choices[supplierPick % choices.length]!.code };
        const before = buildSupplyGraph(model);
        const after = buildSupplyGraph({ ...model, sourcing: [...model.sourcing, extra] });
        expect(after.n).toBe(before.n);
        const lostBefore = allSingleImpacts(before);
        const lostAfter = allSingleImpacts(after);
        const sameBaseline = before.productNodes.every(
          (node, p) => before.baselineDown[node] === after.baselineDown[after.productNodes[p]!],
        );
        for (const code of before.supplierCodes) {
          const downBefore = propagateFailure(before, [code]);
          const downAfter = propagateFailure(after, [code]);
          before.nodes.forEach((node) => {
            if (downAfter[after.indexOf.get(node.id)!] === 1) {
              expect(downBefore[node.index]).toBe(1);
            }
          });
        }
        if (sameBaseline) {
          lostAfter.forEach((impact, s) => {
            const previous = new Set(lostBefore[s]!.productsLost);
            for (const product of impact.productsLost) expect(previous.has(product)).toBe(true);
          });
        }
      }),
      { numRuns: 25 },
    );
  });
  it('a supplier with no customer path left has zero impact', () => {
    fc.assert(
      fc.property(generated, fc.nat(), (model, pickIndex) => {
        const code = model.suppliers[pickIndex % model.suppliers.length]!.code;
        // Its qualified rows as a seller were its only ways to any customer: drop them.
        const cut = {
          ...model,
          sourcing: model.sourcing.filter((row) => row.supplierCode !== code || !row.isQualified),
        };
        const graph = buildSupplyGraph(cut);
        const impact = impactOf(graph, [code]);
        expect(impact.productsLost).toEqual([]);
        expect(impact.revenueImpact).toBe(0);
        const ordinal = graph.supplierOrdinalOf.get(code)!;
        expect(allSingleImpacts(graph)[ordinal]!.productsLost).toEqual([]);
      }),
      { numRuns: 40 },
    );
  });
});
