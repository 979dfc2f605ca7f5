import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts `/api/comparison`: what changed between two runs, its export, and quarterly trends. */
export function mountComparisonRoutes(_app: Express, _deps: FeatureDeps): void {
  // Filled in by the comparison feature.
}
