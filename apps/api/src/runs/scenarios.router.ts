import { Router } from 'express';
import { z } from 'zod';
import { evaluateScenarioSchema, saveScenarioSchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { ScenariosService } from './scenarios.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/** Roles that save, change and delete scenarios. */
export const SCENARIO_WRITERS = ['risk_manager', 'admin'] as const;

/**
 * `/api/scenarios`: saved failure sets. Every signed-in role lists them; risk managers and
 * admins save, replace and delete them.
 */
export function createScenariosRouter(scenarios: ScenariosService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json({ items: scenarios.list() });
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(scenarios.get(parseInput(idParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: SCENARIO_WRITERS,
    handler: (req, res) => {
      const input = parseInput(saveScenarioSchema, req.body, 'body');
      res.status(201).json(scenarios.create(sessionUser(req), input));
    },
  });
  route(router, {
    method: 'put',
    path: '/:id',
    roles: SCENARIO_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(scenarios.update(id, parseInput(saveScenarioSchema, req.body, 'body')));
    },
  });
  route(router, {
    method: 'delete',
    path: '/:id',
    roles: SCENARIO_WRITERS,
    handler: (req, res) => {
      scenarios.delete(parseInput(idParams, req.params, 'params').id);
      res.status(204).end();
    },
  });
  return router;
}

/**
 * `POST /api/network-versions/:id/scenario`: the impact of a failure set on a version, for
 * every signed-in role (plant managers see their own plants' lost products).
 */
export function createScenarioEvaluationRouter(scenarios: ScenariosService): Router {
  const router = Router();
  route(router, {
    method: 'post',
    path: '/:id/scenario',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const set = parseInput(evaluateScenarioSchema, req.body, 'body');
      res.json(scenarios.evaluate(sessionUser(req), id, set));
    },
  });
  return router;
}
