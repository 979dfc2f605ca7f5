/**
 * Test fixtures for the register: a succeeded analysis run and its supplier rows written
 * straight into the database, with the scores a spec computes itself, so register specs do not
 * depend on the analysis engine or the runs component.
 */
import { analysisRuns, runSuppliers, type KeelsonDatabase } from '@keelson/db';

/** One supplier's result as a spec states it; everything else gets neutral values. */
export interface SeedRunSupplier {
  code: string;
  name?: string;
  plants?: string[];
  productsLost?: string[];
  revenueImpact?: number;
  singlePointOfFailure?: boolean;
  likelihood: number;
  impactBand: number;
  rating: number;
  ratingBand: 'low' | 'medium' | 'high' | 'critical';
}

/** Options of {@link seedRun}. */
export interface SeedRunOptions {
  networkVersionId?: number;
  label?: string;
  status?: 'succeeded' | 'failed';
  finishedAt?: string;
  totalWeeklyRevenue?: number;
}

/** Inserts a run with its supplier rows; returns the run id. */
export function seedRun(
  db: KeelsonDatabase,
  suppliers: readonly SeedRunSupplier[],
  options: SeedRunOptions = {},
): number {
  const finishedAt = options.finishedAt ?? '2026-03-02T10:00:00.000Z';
  const run = db.insert(analysisRuns).values({
    networkVersionId: options.networkVersionId ?? 1,
    label: options.label ?? 'Spec run',
    status: options.status ?? 'succeeded',
    progress: 1,
    totals: { totalWeeklyRevenue: options.totalWeeklyRevenue ?? 1_000_000 },
    createdAt: finishedAt,
    startedAt: finishedAt,
    finishedAt,
  }).returning({ id: analysisRuns.id }).get();
  suppliers.forEach((supplier, index) => {
    const productsLost = supplier.productsLost ?? [];
    db.insert(runSuppliers).values({
      runId: run.id,
      code: supplier.code,
      name: supplier.name ?? supplier.code,
      country: 'DE',
      region: 'Europe',
      tier: 1,
      rank: index + 1,
      productsLost,
      productsLostCount: productsLost.length,
      plants: supplier.plants ?? [],
      revenueExposedPerWeek: 0,
      revenueImpact: supplier.revenueImpact ?? 0,
      timeToRecover: 4,
      singlePointOfFailure: supplier.singlePointOfFailure ?? false,
      betweenness: 0,
      degree: 0,
      closeness: 0,
      eigenvector: 0,
      pagerank: 0,
      nexusIndex: 0,
      products: [],
      likelihood: supplier.likelihood,
      likelihoodFactors: {},
      impactBand: supplier.impactBand,
      rating: supplier.rating,
      ratingBand: supplier.ratingBand,
    }).run();
  });
  return run.id;
}
