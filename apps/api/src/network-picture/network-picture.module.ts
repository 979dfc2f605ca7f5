import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { createNetworkPictureRouter } from './network-picture.router';
import { NetworkPictureRepository } from './network-picture.repository';
import { NetworkPictureService } from './network-picture.service';

/** Mounts /api/network-versions/:id/picture. */
export function mountNetworkPictureRoutes(app: Express, deps: FeatureDeps): void {
  const service = new NetworkPictureService(new NetworkPictureRepository(deps.db),
    deps.graphs);
  app.use('/api/network-versions', createNetworkPictureRouter(service));
}
