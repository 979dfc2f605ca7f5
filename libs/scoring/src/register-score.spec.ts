/**
 * The register score against hand computations: the spec's impact bands (section 7) at and
 * around each limit, the rating bands 1-4 / 5-9 / 10-16 / 20-25, and the likelihood of
 * suppliers whose factors are worked out here by hand from the documented rules.
 */
import { describe, expect, it } from 'vitest';
import { compactModel } from '@keelson/supply-graph/testing';
import { fewestAlternativesBySupplier } from './alternatives';
import {
  SCORING_DEFAULTS,
  impactBandOf,
  likelihoodOf,
  ratingBandOf,
  registerScore,
  scoringSettingsSchema,
} from './register-score';

describe('impactBandOf (spec 7: <0.1 %, <0.5 %, <2 %, <5 % of a year of revenue)', () => {
  // Weekly revenue 10 000 -> a year is 520 000; 0.1 % of it is 520.
  const weekly = 10_000;
  it.each([
    [0, 1], [519.99, 1], [520, 2], [2_599, 2], [2_600, 3], [10_399, 3], [10_400, 4],
    [25_999, 4], [26_000, 5], [1e9, 5],
  ])('revenue impact %d gives band %d', (impact, band) => {
    expect(impactBandOf(impact, weekly)).toBe(band);
  });
  it('puts any impact in band 5 when there is no revenue at all, and none in band 1', () => {
    expect(impactBandOf(1, 0)).toBe(5);
    expect(impactBandOf(0, 0)).toBe(1);
  });
});

describe('ratingBandOf (spec 7: 1-4 low, 5-9 medium, 10-16 high, 20-25 critical)', () => {
  it.each([[1, 'low'], [4, 'low'], [5, 'medium'], [9, 'medium'], [10, 'high'], [16, 'high'],
    [20, 'critical'], [25, 'critical']])('rating %d is %s', (rating, band) => {
    expect(ratingBandOf(rating)).toBe(band);
  });
  it('multiplies impact band and likelihood', () => {
    expect(registerScore(4, 3)).toEqual({ impactBand: 4, likelihood: 3, rating: 12,
      ratingBand: 'high' });
  });
});

describe('likelihoodOf (weights 0.25 / 0.15 / 0.15 / 0.25 / 0.20)', () => {
  it('gives 5 for the worst supplier and 1 for the best', () => {
    expect(likelihoodOf({ financialHealth: 1, deliveryScore: 1, hasContinuityPlan: false,
      fewestAlternatives: 0, countryHazard: 5 }).likelihood).toBe(5);
    expect(likelihoodOf({ financialHealth: 5, deliveryScore: 5, hasContinuityPlan: true,
      fewestAlternatives: 3, countryHazard: 1 }).likelihood).toBe(1);
  });
  it('computes a mixed case by hand', () => {
    // Factors: financial (5-3)/4 = 0.5; delivery (5-4)/4 = 0.25; no plan 1; one alternative
    // 0.5; hazard 2 -> 0.25. Mean = 0.25x0.5 + 0.15x0.25 + 0.15x1 + 0.25x0.5 + 0.2x0.25
    // = 0.125 + 0.0375 + 0.15 + 0.125 + 0.05 = 0.4875; 1 + round(1.95) = 3.
    const result = likelihoodOf({ financialHealth: 3, deliveryScore: 4, hasContinuityPlan: false,
      fewestAlternatives: 1, countryHazard: 2 });
    expect(result.factors).toEqual({ financialHealth: 0.5, deliveryScore: 0.25,
      continuityPlan: 1, alternatives: 0.5, countryHazard: 0.25 });
    expect(result.likelihood).toBe(3);
  });
  it('treats unknown values as the middle and an unknown country as the setting', () => {
    // Every factor 0.5 -> 1 + round(2) = 3.
    expect(likelihoodOf({ financialHealth: null, deliveryScore: null, hasContinuityPlan: null,
      fewestAlternatives: null, countryHazard: null }).likelihood).toBe(3);
    const settings = { ...SCORING_DEFAULTS, unknownCountryHazard: 5,
      likelihoodWeights: { financialHealth: 0, deliveryScore: 0, continuityPlan: 0,
        alternatives: 0, countryHazard: 1 } };
    expect(likelihoodOf({ financialHealth: null, deliveryScore: null, hasContinuityPlan: null,
      fewestAlternatives: null, countryHazard: null }, settings).likelihood).toBe(5);
  });
});

describe('fewestAlternativesBySupplier', () => {
  it('counts the other qualified sources of the least covered pair', () => {
    // I1@P1 from A and B (qualified) and C (unqualified); I2@P1 from A only; D sells nothing.
    const model = compactModel({
      plants: ['P1'],
      products: [['F1', 'P1', 100]],
      bom: [['F1', 'I1'], ['F1', 'I2']],
      suppliers: ['A', 'B', 'C', 'D'],
      sourcing: [['P1', 'I1', 'A'], ['P1', 'I1', 'B'], ['P1', 'I1', 'C', false],
        ['P1', 'I2', 'A']],
    });
    expect(Object.fromEntries(fewestAlternativesBySupplier(model))).toEqual({
      A: 0, B: 1, C: null, D: null,
    });
  });
});

describe('scoringSettingsSchema', () => {
  it('accepts the defaults and refuses limits or floors out of order', () => {
    expect(scoringSettingsSchema.safeParse(SCORING_DEFAULTS).success).toBe(true);
    const limits = scoringSettingsSchema.safeParse({ ...SCORING_DEFAULTS,
      impactBandLimits: [0.01, 0.005, 0.02, 0.05] });
    expect(limits.success).toBe(false);
    expect(limits.error?.issues[0]?.path).toEqual(['impactBandLimits', 1]);
    const floors = scoringSettingsSchema.safeParse({ ...SCORING_DEFAULTS,
      ratingBandFloors: { medium: 10, high: 10, critical: 20 } });
    expect(floors.success).toBe(false);
  });
});
