import { Router } from 'express';
import { z } from 'zod';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { PlantsService } from './plants.service';

const codeParams = z.object({ code: z.string().trim().min(1).max(40) });

/** `/api/plants`: the organisation's sites. */
export function createPlantsRouter(service: PlantsService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json({ items: service.list() });
    },
  });
  route(router, {
    method: 'get',
    path: '/:code',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { code } = parseInput(codeParams, req.params, 'params');
      res.json(service.get(sessionUser(req), code));
    },
  });
  return router;
}
