import { Router } from 'express';
import { z } from 'zod';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { networkPictureQuerySchema } from './network-picture-dto';
import type { NetworkPictureService } from './network-picture.service';

const versionParams = z.object({ id: z.coerce.number().int().positive() });

/**
 * `/api/network-versions/:id/picture`: the network drawn as nodes and edges. Every signed-in
 * role reads it; plant managers get the part that belongs to or supplies their plants.
 */
export function createNetworkPictureRouter(service: NetworkPictureService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/:id/picture',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(versionParams, req.params, 'params');
      const query = parseInput(networkPictureQuerySchema, req.query, 'query');
      res.json(service.picture(sessionUser(req), id, query));
    },
  });
  return router;
}
