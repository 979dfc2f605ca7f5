/**
 * The register score of spec section 7: an impact band 1-5 from a supplier's revenue impact, a
 * likelihood 1-5 from what is known about the supplier, and their product, the rating 1-25,
 * banded low / medium / high / critical. Every threshold and weight is a setting an admin edits
 * ({@link SCORING_DEFAULTS}); docs/methods.md explains the defaults.
 *
 * The 5 x 5 matrix is common practice in risk registers, not a standard. The scores support a
 * decision; the company's own procedures make it.
 */
import { z } from 'zod';
import type { RatingBand } from '@keelson/contracts';

export { RATING_BANDS, type RatingBand } from '@keelson/contracts';

/** Weights of the likelihood factors (non-negative; only their ratios matter). */
export interface LikelihoodWeights {
  financialHealth: number;
  deliveryScore: number;
  continuityPlan: number;
  alternatives: number;
  countryHazard: number;
}

/** Every setting of the register score. */
export interface ScoringSettings {
  /**
   * Upper bounds (exclusive) of impact bands 1-4, as a share of a year's revenue of all products
   * (total weekly revenue x 52); above the last is band 5. Spec: 0.1 %, 0.5 %, 2 %, 5 %.
   */
  impactBandLimits: [number, number, number, number];
  likelihoodWeights: LikelihoodWeights;
  /** Lowest rating of the medium, high and critical bands (low starts at 1). */
  ratingBandFloors: { medium: number; high: number; critical: number };
  /** Hazard assumed for a country missing from the country table (1-5). */
  unknownCountryHazard: number;
}

/** The defaults: the spec's thresholds and our documented weights. */
export const SCORING_DEFAULTS: Readonly<ScoringSettings> = Object.freeze({
  impactBandLimits: [0.001, 0.005, 0.02, 0.05],
  likelihoodWeights: {
    financialHealth: 0.25,
    deliveryScore: 0.15,
    continuityPlan: 0.15,
    alternatives: 0.25,
    countryHazard: 0.2,
  },
  ratingBandFloors: { medium: 5, high: 10, critical: 20 },
  unknownCountryHazard: 3,
}) as ScoringSettings;

const share = z.number().min(0).max(1);
/** {@link ScoringSettings} as an admin sends them; limits must increase, floors too. */
export const scoringSettingsSchema = z
  .object({
    impactBandLimits: z.tuple([share, share, share, share]),
    likelihoodWeights: z.object({
      financialHealth: z.number().min(0).max(100),
      deliveryScore: z.number().min(0).max(100),
      continuityPlan: z.number().min(0).max(100),
      alternatives: z.number().min(0).max(100),
      countryHazard: z.number().min(0).max(100),
    }),
    ratingBandFloors: z.object({
      medium: z.number().int().min(2).max(25),
      high: z.number().int().min(3).max(25),
      critical: z.number().int().min(4).max(25),
    }),
    unknownCountryHazard: z.number().int().min(1).max(5),
  })
  .superRefine((settings, context) => {
    const limits = settings.impactBandLimits;
    for (let i = 1; i < limits.length; i++) {
      if (!(limits[i]! > limits[i - 1]!)) {
        context.addIssue({ code: 'custom', path: ['impactBandLimits', i],
          message: 'each impact band limit must be larger than the one before' });
      }
    }
    const { medium, high, critical } = settings.ratingBandFloors;
    if (!(medium < high && high < critical)) {
      context.addIssue({ code: 'custom', path: ['ratingBandFloors'],
        message: 'the band floors must increase: medium < high < critical' });
    }
    const weights = Object.values(settings.likelihoodWeights);
    if (weights.every((weight) => weight === 0)) {
      context.addIssue({ code: 'custom', path: ['likelihoodWeights'],
        message: 'at least one likelihood weight must be above 0' });
    }
  });

/** What the likelihood is computed from, for one supplier. */
export interface LikelihoodInputs {
  /** 1 (poor) - 5 (strong), or null when not known. */
  financialHealth: number | null;
  /** 1 (poor) - 5 (strong), or null when not known. */
  deliveryScore: number | null;
  hasContinuityPlan: boolean | null;
  /**
   * Fewest qualified alternatives over what the supplier sells: for each (item, buyer) it is a
   * qualified source of, the other qualified sources; the minimum over them. null when it sells
   * nothing qualified.
   */
  fewestAlternatives: number | null;
  /** The country's hazard 1-5, or null when the country is not in the table. */
  countryHazard: number | null;
}

/** Each factor as a risk between 0 (reassuring) and 1 (worrying), and the likelihood. */
export interface LikelihoodResult {
  likelihood: number;
  factors: Record<keyof LikelihoodWeights, number>;
}

/**
 * Likelihood 1-5: the weighted mean of five factor risks in [0, 1], mapped to 1 + round(4 x mean).
 * Factor risks: financial health and delivery score (5 - score) / 4, unknown 0.5; continuity plan
 * no 1, yes 0, unknown 0.5; alternatives 0 -> 1, 1 -> 0.5, 2 or more -> 0, none sold 0.5;
 * country hazard (h - 1) / 4 with the unknown-country hazard when missing.
 */
export function likelihoodOf(
  inputs: LikelihoodInputs,
  settings: ScoringSettings = SCORING_DEFAULTS,
): LikelihoodResult {
  const score = (value: number | null) => (value === null ? 0.5 : clamp01((5 - value) / 4));
  const hazard = inputs.countryHazard ?? settings.unknownCountryHazard;
  const factors = {
    financialHealth: score(inputs.financialHealth),
    deliveryScore: score(inputs.deliveryScore),
    continuityPlan: inputs.hasContinuityPlan === null ? 0.5 : inputs.hasContinuityPlan ? 0 : 1,
    alternatives:
      inputs.fewestAlternatives === null
        ? 0.5
        : inputs.fewestAlternatives <= 0
          ? 1
          : inputs.fewestAlternatives === 1
            ? 0.5
            : 0,
    countryHazard: clamp01((hazard - 1) / 4),
  };
  const weights = settings.likelihoodWeights;
  let total = 0;
  let weighted = 0;
  for (const key of Object.keys(factors) as (keyof LikelihoodWeights)[]) {
    total += weights[key];
    weighted += weights[key] * factors[key];
  }
  const mean = total > 0 ? weighted / total : 0.5;
  // Round half up, with a tolerance so that 0.375 x 4 = 1.5 is not lost to floating point.
  return { likelihood: 1 + Math.floor(4 * mean + 0.5 + 1e-9), factors };
}

/** Impact band 1-5 of a revenue impact against a year's revenue of all products. */
export function impactBandOf(
  revenueImpact: number,
  totalWeeklyRevenue: number,
  settings: ScoringSettings = SCORING_DEFAULTS,
): number {
  const yearly = totalWeeklyRevenue * 52;
  const ratio = yearly > 0 ? revenueImpact / yearly : revenueImpact > 0 ? Infinity : 0;
  const index = settings.impactBandLimits.findIndex((limit) => ratio < limit);
  return index === -1 ? 5 : index + 1;
}

/** The band of a rating 1-25. */
export function ratingBandOf(
  rating: number,
  settings: ScoringSettings = SCORING_DEFAULTS,
): RatingBand {
  const { medium, high, critical } = settings.ratingBandFloors;
  if (rating >= critical) return 'critical';
  if (rating >= high) return 'high';
  if (rating >= medium) return 'medium';
  return 'low';
}

/** The whole register score of one supplier. */
export interface RegisterScore {
  impactBand: number;
  likelihood: number;
  rating: number;
  ratingBand: RatingBand;
}

/** Impact band x likelihood (an overridden likelihood when given) and its band. */
export function registerScore(
  impactBand: number,
  likelihood: number,
  settings: ScoringSettings = SCORING_DEFAULTS,
): RegisterScore {
  const rating = impactBand * likelihood;
  return { impactBand, likelihood, rating, ratingBand: ratingBandOf(rating, settings) };
}

function clamp01(value: number): number {
  return Math.min(1, Math.max(0, value));
}
