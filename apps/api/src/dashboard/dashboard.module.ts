import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts `/api/dashboard`: the home page's figures for the signed-in user's role. */
export function mountDashboardRoutes(_app: Express, _deps: FeatureDeps): void {
  // Filled in by the dashboard feature.
}
