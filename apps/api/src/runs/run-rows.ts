/**
 * Turns an analysis into the rows a run stores: per supplier the engine's result, the register
 * score (likelihood from what is known about the supplier, impact band from its revenue impact
 * against a year of all products' revenue), the plants of the lost products and the rank.
 */
import type { SupplyModel } from '@keelson/contracts';
import {
  fewestAlternativesBySupplier,
  impactBandOf,
  likelihoodOf,
  registerScore,
  type RatingBand,
  type ScoringSettings,
} from '@keelson/scoring';
import {
  compareCodePoints,
  type AnalysisResult,
  type ProductImpact,
  type SupplierResult,
} from '@keelson/supply-graph';

/** One supplier's stored result (the columns of `run_suppliers`). */
export interface RunRow extends Omit<SupplierResult, 'products'> {
  rank: number;
  products: ProductImpact[];
  plants: string[];
  likelihood: number;
  likelihoodFactors: Record<string, number>;
  impactBand: number;
  rating: number;
  ratingBand: RatingBand;
}

/**
 * The ranking order: revenue impact descending, then the number of products lost descending,
 * then the code in code-point order (so the order never depends on the database).
 */
export function compareByRank(
  a: Pick<SupplierResult, 'revenueImpact' | 'productsLost' | 'code'>,
  b: Pick<SupplierResult, 'revenueImpact' | 'productsLost' | 'code'>,
): number {
  return (
    b.revenueImpact - a.revenueImpact ||
    b.productsLost.length - a.productsLost.length ||
    compareCodePoints(a.code, b.code)
  );
}

/** Normalised country code for the hazard table (trimmed, upper case). */
export function countryKey(country: string): string {
  return country.trim().toUpperCase();
}

/**
 * The rows of a run, in rank order. `hazards` maps country codes (upper case) to their hazard
 * 1-5; a missing country takes the settings' unknown-country hazard.
 */
export function buildRunRows(
  model: SupplyModel,
  analysis: AnalysisResult,
  hazards: ReadonlyMap<string, number>,
  settings: ScoringSettings,
): RunRow[] {
  const alternatives = fewestAlternativesBySupplier(model);
  const records = new Map(model.suppliers.map((supplier) => [supplier.code, supplier]));
  const total = analysis.totals.totalWeeklyRevenue;
  const rows = analysis.suppliers.map((result): RunRow => {
    const record = records.get(result.code);
    const { likelihood, factors } = likelihoodOf(
      {
        financialHealth: record?.financialHealth ?? null,
        deliveryScore: record?.deliveryScore ?? null,
        hasContinuityPlan: record?.hasContinuityPlan ?? null,
        fewestAlternatives: alternatives.get(result.code) ?? null,
        countryHazard: hazards.get(countryKey(result.country)) ?? null,
      },
      settings,
    );
    const impactBand = impactBandOf(result.revenueImpact, total, settings);
    const score = registerScore(impactBand, likelihood, settings);
    const plants = [...new Set(result.products.map((p) => p.plantCode))].sort(compareCodePoints);
    return {
      ...result,
      rank: 0,
      plants,
      likelihood,
      likelihoodFactors: factors,
      impactBand,
      rating: score.rating,
      ratingBand: score.ratingBand,
    };
  });
  rows.sort(compareByRank);
  rows.forEach((row, index) => (row.rank = index + 1));
  return rows;
}
