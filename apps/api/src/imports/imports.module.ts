import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts `/api/imports` and `/api/import-mappings`. */
export function mountImportRoutes(app: Express, deps: FeatureDeps): void {
  void app;
  void deps;
}
