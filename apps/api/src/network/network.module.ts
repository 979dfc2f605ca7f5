import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts `/api/network-versions` and `/api/countries`. */
export function mountNetworkRoutes(app: Express, deps: FeatureDeps): void {
  void app;
  void deps;
}
