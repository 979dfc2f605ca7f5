import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { createComparisonRouter } from './comparison.router';
import { ComparisonRepository } from './comparison.repository';
import { ComparisonService } from './comparison.service';

/** Mounts `/api/comparison`: what changed between two runs, its export, and quarterly trends. */
export function mountComparisonRoutes(app: Express, deps: FeatureDeps): void {
  const comparison = new ComparisonService({ repository: new ComparisonRepository(deps.db) });
  app.use('/api/comparison', createComparisonRouter({ comparison, now: deps.now }));
}
