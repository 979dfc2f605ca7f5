import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import {
  rescoringScheduleSchema,
  resumeRescoringSchema,
  startRescoringSchema,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { RescoringScheduleService } from './rescoring-schedule.service';
import type { RescoringService } from './rescoring.service';

/** Roles that start, resume and cancel re-scorings (forcing one is for admins only). */
export const RESCORING_WRITERS = ['risk_manager', 'admin'] as const;

const idParams = z.object({ id: z.coerce.number().int().positive() });
const listQuery = z.object({
  limit: z.coerce.number().int().min(1).max(100).default(20),
  offset: z.coerce.number().int().min(0).default(0),
});

// A path under /api/rescoring that is not an id (another feature's `/trends`) passes on.
const numericIdOnly: RequestHandler = (req, _res, next) =>
  (/^\d+$/.test(String(req.params['id'])) ? next() : next('router'));

/** The services behind `/api/rescoring`. */
export interface RescoringRouterDeps {
  rescoring: RescoringService;
  schedule: RescoringScheduleService;
}

/**
 * `/api/rescoring`: list and read re-scorings (every signed-in role), start, resume, restart
 * and cancel them (risk managers, admins), read the timetable (every role) and change it
 * (admins). Progress is the analysis run's: follow `/api/analysis-runs/:id/events`.
 */
export function createRescoringRouter(deps: RescoringRouterDeps): Router {
  const router = Router();
  const { rescoring, schedule } = deps;
  // The schedule's paths come before `/:id`, so "schedule" is never read as an id.
  route(router, {
    method: 'get',
    path: '/schedule',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json(schedule.get());
    },
  });
  route(router, {
    method: 'put',
    path: '/schedule',
    roles: ['admin'],
    handler: (req, res) => {
      const input = parseInput(rescoringScheduleSchema, req.body, 'body');
      res.json(schedule.update(sessionUser(req), input));
    },
  });
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(rescoring.list(parseInput(listQuery, req.query, 'query')));
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: RESCORING_WRITERS,
    handler: (req, res) => {
      const input = parseInput(startRescoringSchema, req.body, 'body');
      const started = rescoring.start(sessionUser(req), input, 'manual');
      res.status(202).location(`/api/rescoring/${started.id}`).json(started);
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    before: [numericIdOnly],
    handler: (req, res) => {
      res.json(rescoring.get(parseInput(idParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/resume',
    roles: RESCORING_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const input = parseInput(resumeRescoringSchema, req.body, 'body');
      res.status(202).json(rescoring.resume(sessionUser(req), id, input));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/cancel',
    roles: RESCORING_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(rescoring.cancel(sessionUser(req), id));
    },
  });
  return router;
}
