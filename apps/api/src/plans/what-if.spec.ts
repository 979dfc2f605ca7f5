/**
 * The what-if of a plan. References: (1) a two-plant network worked out by hand below, with the
 * rules of shared/spec/supply-model.md sections 3, 4 and 7 and the defaults of SCORING_DEFAULTS
 * (libs/scoring/src/register-score.ts); (2) the engine itself on the demo workbook
 * (data/demo/keelson-demo.xlsx read with readWorkbook): `analyse()` of @keelson/supply-graph for
 * the impact and `buildRunRows` (runs/run-rows.ts) for the rating, as a run stores them.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { PlanChange, SupplyModel } from '@keelson/contracts';
import { SCORING_DEFAULTS, type ScoringSettings } from '@keelson/scoring';
import { analyse } from '@keelson/supply-graph';
import { DEFAULT_COUNTRIES } from '../countries/default-countries';
import { AppError } from '../http/app-error';
import { buildRunRows } from '../runs/run-rows';
import { demoModel } from '../runs/run-spec-helpers';
import { applyPlanChanges, evaluateWhatIf, type WhatIfContext } from './what-if';

/*
 * The hand network.
 *   Plants P-A, P-B. Products F-1 at P-A (1000 a week), F-2 at P-B (500 a week): 1500 a week,
 *   78 000 a year.
 *   BOM: F-1 <- I-1; F-2 <- I-1 and A-1 (an assembly, made); A-1 <- I-2.
 *   Sourcing: P-A and P-B buy I-1 from S-1 only (P-A also from S-3, unqualified: in
 *   qualification); P-B buys I-2 from S-2 and S-3.
 *   Stock: I-1 at P-A 2 weeks, at P-B 4 weeks.
 *   S-1: recovery 10 weeks, financial health 3, delivery 3, no continuity plan, country DE.
 *
 * S-1 failing alone: I-1 is down at both plants (its only qualified source), so F-1 and F-2 are
 * lost; I-2 at P-B keeps two sources. Time to recover 10 (S-1's recovery).
 *   F-1: survives 2 weeks (I-1 at P-A), loses 10 - 2 = 8 weeks: 1000 x 8 = 8000.
 *   F-2: survives 4 weeks (I-1 at P-B is its only down bought node), loses 6: 500 x 6 = 3000.
 *   Revenue impact 11 000, exposed 1500 a week. 11 000 / 78 000 = 14.1 % >= 5 %: impact band 5.
 * Likelihood of S-1 (weights 0.25, 0.15, 0.15, 0.25, 0.2): financial (5-3)/4 = 0.5, delivery
 *   0.5, no continuity plan 1, alternatives 0 -> 1, hazard 3 -> (3-1)/4 = 0.5; mean 0.7;
 *   1 + round(2.8) = 4. Rating 5 x 4 = 20: critical.
 */
function handNetwork(): SupplyModel {
  const supplier = (code: string, recoveryWeeks: number) => ({ code, name: code, country: 'DE',
    region: 'Europe', recoveryWeeks, financialHealth: null, deliveryScore: null,
    hasContinuityPlan: null });
  const source = (buyerCode: string, itemCode: string, supplierCode: string, isQualified = true) =>
    ({ buyerCode, itemCode, supplierCode, sharePct: null, isQualified });
  return {
    plants: [{ code: 'P-A', name: 'A', country: 'DE' }, { code: 'P-B', name: 'B', country: 'DE' }],
    products: [
      { code: 'F-1', plantCode: 'P-A', name: 'F-1', weeklyRevenue: 1000 },
      { code: 'F-2', plantCode: 'P-B', name: 'F-2', weeklyRevenue: 500 },
    ],
    bom: [
      { parentCode: 'F-1', childCode: 'I-1', qtyPer: 1 },
      { parentCode: 'F-2', childCode: 'I-1', qtyPer: 1 },
      { parentCode: 'F-2', childCode: 'A-1', qtyPer: 1 },
      { parentCode: 'A-1', childCode: 'I-2', qtyPer: 2 },
    ],
    suppliers: [
      { ...supplier('S-1', 10), financialHealth: 3, deliveryScore: 3, hasContinuityPlan: false },
      supplier('S-2', 4),
      supplier('S-3', 6),
    ],
    sourcing: [
      source('P-A', 'I-1', 'S-1'),
      source('P-B', 'I-1', 'S-1'),
      source('P-A', 'I-1', 'S-3', false),
      source('P-B', 'I-2', 'S-2'),
      source('P-B', 'I-2', 'S-3'),
    ],
    stock: [
      { plantCode: 'P-A', itemCode: 'I-1', weeksOfCover: 2 },
      { plantCode: 'P-B', itemCode: 'I-1', weeksOfCover: 4 },
    ],
  };
}

const context: WhatIfContext = {
  hazards: new Map([['DE', 3]]),
  settings: SCORING_DEFAULTS,
  likelihoodOverride: null,
};

/** The AppError a call throws (fails the test when it throws nothing). */
function failureOf(call: () => unknown): AppError {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(AppError);
    return error as AppError;
  }
  throw new Error('expected the call to throw');
}

describe('evaluateWhatIf on the hand network', () => {
  it('before: F-1 and F-2 lost, 11 000 impact, 10 weeks to recover, rating 20 (hand)', () => {
    const { before, after } = evaluateWhatIf(handNetwork(), 'S-1', [], context);
    expect(before).toEqual({
      productsLost: ['F-1', 'F-2'], revenueExposedPerWeek: 1500, revenueImpact: 11_000,
      timeToRecover: 10, singlePointOfFailure: true, impactBand: 5, likelihood: 4, rating: 20,
      ratingBand: 'critical',
    });
    // No changes: the after side is the same computation on an unchanged copy.
    expect(after).toEqual(before);
  });

  it('a second source of I-1 for every buyer ends the single point of failure (hand)', () => {
    const changes: PlanChange[] = [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-2', buyerCode: null },
    ];
    const { before, after } = evaluateWhatIf(handNetwork(), 'S-1', changes, context);
    expect(before.singlePointOfFailure).toBe(true);
    // Hand: I-1 keeps S-2 at both plants, nothing is lost; 0 impact is band 1. The time to
    // recover is still S-1's own 10 weeks. Alternatives 1 -> 0.5: mean 0.7 - 0.25 x 0.5 = 0.575,
    // 1 + round(2.3) = 3; rating 1 x 3 = 3, low.
    expect(after).toEqual({
      productsLost: [], revenueExposedPerWeek: 0, revenueImpact: 0, timeToRecover: 10,
      singlePointOfFailure: false, impactBand: 1, likelihood: 3, rating: 3, ratingBand: 'low',
    });
  });

  it('a second source at one plant keeps the other plant\'s loss (hand)', () => {
    const changes: PlanChange[] = [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-2', buyerCode: 'P-B' },
    ];
    const { after } = evaluateWhatIf(handNetwork(), 'S-1', changes, context);
    // Hand: only F-1 is lost, 1000 x 8 = 8000; 8000 / 78 000 = 10.3 %: band 5. The fewest
    // alternatives of S-1 stay 0 (I-1 at P-A): likelihood 4, rating 20.
    expect(after).toMatchObject({ productsLost: ['F-1'], revenueExposedPerWeek: 1000,
      revenueImpact: 8000, singlePointOfFailure: true, impactBand: 5, likelihood: 4, rating: 20 });
  });

  it('raising the cover of I-1 at P-A to 6 weeks lowers the impact by 4000 (hand)', () => {
    const changes: PlanChange[] = [
      { kind: 'raise_cover', plantCode: 'P-A', itemCode: 'I-1', weeksOfCover: 6 },
    ];
    const { before, after } = evaluateWhatIf(handNetwork(), 'S-1', changes, context);
    // Hand: F-1 loses 10 - 6 = 4 weeks instead of 8: 1000 x (8 - 4) = 4000 less; 7000 in all.
    expect(before.revenueImpact - after.revenueImpact).toBe(4000);
    expect(after).toMatchObject({ productsLost: ['F-1', 'F-2'], revenueImpact: 7000,
      singlePointOfFailure: true });
  });

  it('cover on a plant without a stock row adds the row (hand)', () => {
    const model = handNetwork();
    model.stock = [];
    const changes: PlanChange[] = [
      { kind: 'raise_cover', plantCode: 'P-B', itemCode: 'I-1', weeksOfCover: 3 },
    ];
    const { before, after } = evaluateWhatIf(model, 'S-1', changes, context);
    // Hand, no stock: 1000 x 10 + 500 x 10 = 15 000; with 3 weeks at P-B: 500 x 7, 13 500.
    expect([before.revenueImpact, after.revenueImpact]).toEqual([15_000, 13_500]);
    expect(applyPlanChanges(model, 'S-1', changes).stock)
      .toEqual([{ plantCode: 'P-B', itemCode: 'I-1', weeksOfCover: 3 }]);
  });

  it('a time to recover of 5 weeks changes the time to recover and the impact (hand)', () => {
    const changes: PlanChange[] = [{ kind: 'set_recovery', supplierCode: 'S-1', recoveryWeeks: 5 }];
    const { after } = evaluateWhatIf(handNetwork(), 'S-1', changes, context);
    // Hand: F-1 loses 5 - 2 = 3 weeks (3000), F-2 5 - 4 = 1 (500): 3500. 3500 / 78 000 = 4.5 %,
    // band 4; rating 4 x 4 = 16, high.
    expect(after).toMatchObject({ timeToRecover: 5, revenueImpact: 3500, impactBand: 4,
      rating: 16, ratingBand: 'high', singlePointOfFailure: true });
  });

  it('keeps a likelihood override on both sides (hand)', () => {
    const changes: PlanChange[] = [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-2', buyerCode: null },
    ];
    const { before, after } = evaluateWhatIf(handNetwork(), 'S-1', changes,
      { ...context, likelihoodOverride: 2 });
    // Hand: 5 x 2 = 10 (high) before, 1 x 2 = 2 (low) after.
    expect([before.likelihood, before.rating, before.ratingBand]).toEqual([2, 10, 'high']);
    expect([after.likelihood, after.rating, after.ratingBand]).toEqual([2, 2, 'low']);
  });

  it('looks the country up trimmed and upper case; a missing one takes the default (hand)', () => {
    const model = handNetwork();
    model.suppliers[0] = { ...model.suppliers[0]!, country: ' de ' };
    const hazardOf = (hazards: Map<string, number>, unknownCountryHazard: number) =>
      evaluateWhatIf(model, 'S-1', [], { ...context, hazards,
        settings: { ...SCORING_DEFAULTS, unknownCountryHazard } }).before.likelihood;
    // Hand: hazard 1 -> risk 0; mean 0.7 - 0.2 x 0.5 = 0.6; 1 + round(2.4) = 3.
    expect(hazardOf(new Map([['DE', 1]]), 3)).toBe(3);
    // Hand: not in the table, the unknown-country hazard 1 counts: 3 again; with 3 it is 4.
    expect(hazardOf(new Map(), 1)).toBe(3);
    expect(hazardOf(new Map(), 3)).toBe(4);
  });
});

describe('applyPlanChanges', () => {
  it('never changes its input model', () => {
    const model = handNetwork();
    const copy = structuredClone(model);
    applyPlanChanges(model, 'S-1', [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-3', buyerCode: 'P-A' },
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-N', buyerCode: null,
        newSupplier: { name: 'New', country: 'PL', region: 'Europe', recoveryWeeks: 8 } },
      { kind: 'raise_cover', plantCode: 'P-A', itemCode: 'I-1', weeksOfCover: 9 },
      { kind: 'set_recovery', supplierCode: 'S-1', recoveryWeeks: 1 },
    ]);
    expect(model).toEqual(copy);
  });

  it('qualifies an unqualified row for the same triple instead of adding a duplicate', () => {
    const model = handNetwork();
    const changed = applyPlanChanges(model, 'S-1', [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-3', buyerCode: 'P-A' },
    ]);
    expect(changed.sourcing).toHaveLength(model.sourcing.length);
    expect(changed.sourcing.filter((row) => row.supplierCode === 'S-3' && row.itemCode === 'I-1'))
      .toEqual([{ buyerCode: 'P-A', itemCode: 'I-1', supplierCode: 'S-3', sharePct: null,
        isQualified: true }]);
  });

  it('with buyerCode null, adds the source for every buyer of the item from S-1', () => {
    const changed = applyPlanChanges(handNetwork(), 'S-1', [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-3', buyerCode: null },
    ]);
    // P-A's unqualified S-3 row is qualified; P-B gets a new row.
    const rows = changed.sourcing
      .filter((row) => row.supplierCode === 'S-3' && row.itemCode === 'I-1');
    expect(rows.map((row) => [row.buyerCode, row.isQualified]))
      .toEqual([['P-A', true], ['P-B', true]]);
  });

  it('applies changes in order: a new supplier added first can have its recovery set', () => {
    const changed = applyPlanChanges(handNetwork(), 'S-1', [
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-N', buyerCode: 'P-A',
        newSupplier: { name: 'Nordwerk', country: 'PL', region: 'Europe', recoveryWeeks: 8 } },
      { kind: 'set_recovery', supplierCode: 'S-N', recoveryWeeks: 3 },
    ]);
    expect(changed.suppliers.find((supplier) => supplier.code === 'S-N')).toEqual({
      code: 'S-N', name: 'Nordwerk', country: 'PL', region: 'Europe', recoveryWeeks: 3,
      financialHealth: null, deliveryScore: null, hasContinuityPlan: null,
    });
    expect(changed.sourcing.at(-1)).toEqual({ buyerCode: 'P-A', itemCode: 'I-1',
      supplierCode: 'S-N', sharePct: null, isQualified: true });
  });

  it('a later change sees an earlier one: set_recovery before it is refused', () => {
    const failure = failureOf(() => applyPlanChanges(handNetwork(), 'S-1', [
      { kind: 'set_recovery', supplierCode: 'S-N', recoveryWeeks: 3 },
      { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-N', buyerCode: 'P-A',
        newSupplier: { name: 'Nordwerk', country: 'PL', region: 'Europe', recoveryWeeks: 8 } },
    ]));
    expect(failure.message).toBe('body.changes[0].supplierCode: the network has no supplier S-N');
  });
});

describe('located errors', () => {
  const newSupplier = { name: 'New', country: 'PL', region: 'Europe', recoveryWeeks: 8 };
  // A valid first change, so that each refusal names index 1.
  const first: PlanChange = { kind: 'raise_cover', plantCode: 'P-A', itemCode: 'I-1',
    weeksOfCover: 3 };
  const cases: Array<[string, PlanChange, string, string]> = [
    ['an unknown item', { kind: 'add_source', itemCode: 'I-999', supplierCode: 'S-2',
      buyerCode: null }, 'itemCode', 'the network has no item I-999'],
    ['an unknown plant', { kind: 'raise_cover', plantCode: 'P-Z', itemCode: 'I-1',
      weeksOfCover: 3 }, 'plantCode', 'the network has no plant P-Z'],
    ['an unknown item for cover', { kind: 'raise_cover', plantCode: 'P-A', itemCode: 'I-999',
      weeksOfCover: 3 }, 'itemCode', 'the network has no item I-999'],
    ['an unknown buyer', { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-2',
      buyerCode: 'B-9' }, 'buyerCode', 'the network has no plant or supplier B-9'],
    ['an unknown supplier', { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-9',
      buyerCode: null }, 'supplierCode',
    'the network has no supplier S-9; describe it in newSupplier to add it'],
    ['an unknown supplier to recover', { kind: 'set_recovery', supplierCode: 'S-9',
      recoveryWeeks: 2 }, 'supplierCode', 'the network has no supplier S-9'],
    ['newSupplier for an existing supplier', { kind: 'add_source', itemCode: 'I-1',
      supplierCode: 'S-2', buyerCode: null, newSupplier }, 'supplierCode',
    'S-2 is already a supplier of the network; leave out newSupplier to add it as a source'],
    ['newSupplier with a plant\'s code', { kind: 'add_source', itemCode: 'I-1',
      supplierCode: 'P-B', buyerCode: 'P-A', newSupplier }, 'supplierCode',
    'P-B is already a plant code of the network; a new supplier needs a code of its own'],
    ['an item the plan\'s supplier does not supply', { kind: 'add_source', itemCode: 'I-2',
      supplierCode: 'S-3', buyerCode: null }, 'itemCode',
    'S-1, the plan\'s supplier, is not a qualified source of I-2 for anyone; name a buyerCode'],
    ['the plan\'s own supplier', { kind: 'add_source', itemCode: 'I-1', supplierCode: 'S-1',
      buyerCode: null }, 'supplierCode',
    'S-1 is the plan\'s own supplier; a second source has to be another supplier'],
    ['a supplier as its own source', { kind: 'add_source', itemCode: 'I-9', supplierCode: 'S-3',
      buyerCode: 'S-3' }, 'buyerCode', 'S-3 cannot be a source of its own purchases'],
    ['a supplier that buys the item itself (buyer null)', { kind: 'add_source', itemCode: 'I-9',
      supplierCode: 'S-3', buyerCode: null }, 'supplierCode',
    'S-3 buys I-9 itself; a supplier cannot be its own source'],
    ['a made item bought at a plant', { kind: 'add_source', itemCode: 'A-1', supplierCode: 'S-2',
      buyerCode: 'P-B' }, 'itemCode',
    'A-1 is made at the plants (it has a bill of materials); plant P-B cannot buy it'],
    ['cover of a made item', { kind: 'raise_cover', plantCode: 'P-B', itemCode: 'A-1',
      weeksOfCover: 3 }, 'itemCode',
    'A-1 is made at the plants; the analysis counts the cover of bought items only'],
    ['cover at a plant that does not use the item', { kind: 'raise_cover', plantCode: 'P-A',
      itemCode: 'I-2', weeksOfCover: 3 }, 'itemCode', 'plant P-A neither buys nor uses I-2 today'],
    ['a plant that does not use the item', { kind: 'add_source', itemCode: 'I-2',
      supplierCode: 'S-2', buyerCode: 'P-A' }, 'buyerCode', 'P-A neither buys nor uses I-2 today'],
    ['a supplier buyer that does not buy the item', { kind: 'add_source', itemCode: 'I-1',
      supplierCode: 'S-2', buyerCode: 'S-3' }, 'buyerCode', 'S-3 neither buys nor uses I-1 today'],
    ['a source that is already qualified', { kind: 'add_source', itemCode: 'I-2',
      supplierCode: 'S-3', buyerCode: 'P-B' }, 'supplierCode',
    'S-3 is already a qualified source of I-2 for P-B'],
  ];

  // The hand network plus one supplier buyer: S-3 buys raw material I-9 from S-1.
  const withSupplierBuyer = (): SupplyModel => {
    const model = handNetwork();
    model.sourcing.push({ buyerCode: 'S-3', itemCode: 'I-9', supplierCode: 'S-1', sharePct: null,
      isQualified: true });
    return model;
  };

  it.each(cases)('refuses %s, naming index, field and value', (_, change, field, message) => {
    const model = withSupplierBuyer();
    const copy = structuredClone(model);
    const failure = failureOf(() => evaluateWhatIf(model, 'S-1', [first, change], context));
    const path = `body.changes[1].${field}`;
    expect(failure.status).toBe(400);
    expect(failure.code).toBe('invalid_request');
    expect(failure.message).toBe(`${path}: ${message}`);
    expect(failure.details).toEqual({ issues: [{ path, message }] });
    // A refused change leaves the input as it was (the first change worked on a copy).
    expect(model).toEqual(copy);
  });

  it('answers 404 naming an unknown plan supplier', () => {
    for (const call of [
      () => evaluateWhatIf(handNetwork(), 'S-404', [], context),
      () => applyPlanChanges(handNetwork(), 'S-404', []),
    ]) {
      const failure = failureOf(call);
      expect([failure.status, failure.code]).toEqual([404, 'not_found']);
      expect(failure.message).toContain('S-404');
    }
  });
});

describe('the demo network, against the engine', () => {
  let model: SupplyModel;
  // The shipped country table's hazards, keyed as the runs repository keys them.
  const hazards = new Map(DEFAULT_COUNTRIES.map((country) => [country.code, country.hazard]));
  // Other weights and limits than the defaults, so that a setting left out would show.
  const settings: ScoringSettings = {
    ...SCORING_DEFAULTS,
    impactBandLimits: [0.0005, 0.002, 0.01, 0.03],
    likelihoodWeights: { financialHealth: 1, deliveryScore: 1, continuityPlan: 2,
      alternatives: 3, countryHazard: 1 },
  };

  beforeAll(async () => {
    model = await demoModel();
  }, 60_000);

  it('before equals the analysis and the run rows for every supplier', () => {
    const analysis = analyse(model);
    for (const ctx of [{ hazards, settings, likelihoodOverride: null },
      { hazards, settings: SCORING_DEFAULTS, likelihoodOverride: null }]) {
      const rows = new Map(buildRunRows(model, analysis, ctx.hazards, ctx.settings)
        .map((row) => [row.code, row]));
      // S-2-SHARED-A and S-2-SHARED-B: the demo's hidden single points of failure.
      expect(rows.get('S-2-SHARED-A')!.singlePointOfFailure).toBe(true);
      for (const result of analysis.suppliers) {
        const { before } = evaluateWhatIf(model, result.code, [], ctx);
        const row = rows.get(result.code)!;
        expect(before, result.code).toEqual({
          productsLost: result.productsLost,
          revenueExposedPerWeek: result.revenueExposedPerWeek,
          revenueImpact: result.revenueImpact,
          timeToRecover: result.timeToRecover,
          singlePointOfFailure: result.singlePointOfFailure,
          impactBand: row.impactBand,
          likelihood: row.likelihood,
          rating: row.rating,
          ratingBand: row.ratingBand,
        });
      }
    }
  });

  /*
   * The second source chosen for S-2-SHARED-A (the browser journey uses the same):
   * S-2-SHARED-A supplies one item, material M-01, to six tier-1 suppliers (S-1-001, S-1-002,
   * S-1-011 to S-1-014), and it is their only qualified source of it. The new source is S-2-011:
   * an existing tier-2 supplier (PL, Europe, like S-2-SHARED-A in CZ) that buys nothing (so no
   * supplier is upstream of it and no failure can reach it through its own purchases), is not a
   * single point of failure itself and is not upstream or downstream of S-2-SHARED-A (which buys
   * nothing either). buyerCode null: M-01 for each of the six buyers.
   */
  const secondSource: PlanChange[] = [
    { kind: 'add_source', itemCode: 'M-01', supplierCode: 'S-2-011', buyerCode: null },
  ];

  it('the chosen second source fits: same tier, buys nothing, not a single point', () => {
    const analysis = analyse(model);
    const result = (code: string) => analysis.suppliers.find((s) => s.code === code)!;
    expect([result('S-2-011').tier, result('S-2-SHARED-A').tier]).toEqual([2, 2]);
    expect(model.sourcing.filter((row) => row.buyerCode === 'S-2-011')).toEqual([]);
    expect(model.sourcing.filter((row) => row.buyerCode === 'S-2-SHARED-A')).toEqual([]);
    expect(result('S-2-011').singlePointOfFailure).toBe(false);
    expect([...new Set(model.sourcing.filter((row) => row.supplierCode === 'S-2-SHARED-A')
      .map((row) => row.itemCode))]).toEqual(['M-01']);
  });

  it('a second source of M-01 from S-2-011 ends S-2-SHARED-A as a single point of failure', () => {
    const ctx = { hazards, settings: SCORING_DEFAULTS, likelihoodOverride: null };
    const { before, after } = evaluateWhatIf(model, 'S-2-SHARED-A', secondSource, ctx);
    expect(before.singlePointOfFailure).toBe(true);
    expect(before.productsLost.length).toBeGreaterThan(0);
    expect(after).toMatchObject({ singlePointOfFailure: false, productsLost: [],
      revenueImpact: 0, revenueExposedPerWeek: 0, impactBand: 1 });
    expect(after.rating).toBeLessThan(before.rating);
    // The after side equals a full analysis and run rows of the changed copy.
    const changed = applyPlanChanges(model, 'S-2-SHARED-A', secondSource);
    expect(changed.sourcing.length - model.sourcing.length).toBe(6);
    const analysis = analyse(changed);
    const row = buildRunRows(changed, analysis, hazards, SCORING_DEFAULTS)
      .find((r) => r.code === 'S-2-SHARED-A')!;
    expect(after).toEqual({
      productsLost: row.productsLost, revenueExposedPerWeek: row.revenueExposedPerWeek,
      revenueImpact: row.revenueImpact, timeToRecover: row.timeToRecover,
      singlePointOfFailure: row.singlePointOfFailure, impactBand: row.impactBand,
      likelihood: row.likelihood, rating: row.rating, ratingBand: row.ratingBand,
    });
  });
});
