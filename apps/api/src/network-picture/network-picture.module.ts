import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts /api/network-versions/:id/picture. */
export function mountNetworkPictureRoutes(app: Express, deps: FeatureDeps): void {
  void app;
  void deps;
}
