import { Router } from 'express';
import { z } from 'zod';
import {
  createPlanSchema,
  createTaskSchema,
  decidePlanSchema,
  listPlansQuerySchema,
  planChangeSchema,
  updatePlanSchema,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { PlanApprovalsService } from './plan-approvals.service';
import { PLAN_WRITERS } from './plan-rules';
import type { PlansService } from './plans.service';
import type { TasksService } from './tasks.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });
const entryParams = z.object({ entryId: z.coerce.number().int().positive() });
/** POST /api/plans/:id/what-if body: changes to save and evaluate, or none for the stored. */
const whatIfSchema = z.object({ changes: z.array(planChangeSchema).max(50).optional() });

/** What the plan routers need. */
export interface PlanRouterDeps {
  plans: PlansService;
  approvals: PlanApprovalsService;
  tasks: TasksService;
}

/**
 * `/api/register/:entryId/plans` (mounted with merged params): an entry's plans for every
 * signed-in role within their plants; new drafts by risk managers and administrators.
 */
export function createEntryPlansRouter(deps: PlanRouterDeps): Router {
  const router = Router({ mergeParams: true });
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { entryId } = parseInput(entryParams, req.params, 'params');
      res.json(deps.plans.listForEntry(sessionUser(req), entryId));
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { entryId } = parseInput(entryParams, req.params, 'params');
      const body = parseInput(createPlanSchema, req.body, 'body');
      res.status(201).json(deps.plans.create(sessionUser(req), entryId, body));
    },
  });
  return router;
}

/**
 * `/api/plans`: lists (`awaitingMe=true` is a plant manager's approvals) and plans for every
 * signed-in role within their plants; edits, the what-if, submission, withdrawal and new tasks
 * by risk managers and administrators; decisions by plant managers.
 */
export function createPlansRouter(deps: PlanRouterDeps): Router {
  const router = Router();
  const { plans, approvals } = deps;
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const query = parseInput(listPlansQuerySchema, req.query, 'query');
      res.json(plans.list(sessionUser(req), query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(plans.detail(sessionUser(req), id));
    },
  });
  route(router, {
    method: 'patch',
    path: '/:id',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(updatePlanSchema, req.body, 'body');
      res.json(plans.update(sessionUser(req), id, body));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/what-if',
    roles: PLAN_WRITERS,
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(whatIfSchema, req.body, 'body');
      res.json(await plans.whatIf(sessionUser(req), id, body.changes));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/submit',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(approvals.submit(sessionUser(req), id));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/withdraw',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(plans.withdraw(sessionUser(req), id));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/decisions',
    roles: ['plant_manager'],
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(decidePlanSchema, req.body, 'body');
      res.json(approvals.decide(sessionUser(req), id, body));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/tasks',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(createTaskSchema, req.body, 'body');
      const user = sessionUser(req);
      res.status(201).json(deps.tasks.detail(user, plans.addTask(user, id, body)));
    },
  });
  return router;
}
