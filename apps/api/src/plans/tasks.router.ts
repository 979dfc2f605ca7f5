import { Router } from 'express';
import { z } from 'zod';
import {
  createTaskCommentSchema,
  myTasksQuerySchema,
  updateTaskSchema,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import { PLAN_WRITERS } from './plan-rules';
import type { TasksService } from './tasks.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/**
 * `/api/tasks`: my tasks (and their export) and a task with its comments for every signed-in
 * role (within their plants); everyone's tasks and their export for risk managers and
 * administrators; changes by the owner, risk managers and administrators (the service decides
 * which); deletion by risk managers and administrators; comments by anyone who may see the plan.
 */
export function createTasksRouter(tasks: TasksService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/mine',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const query = parseInput(myTasksQuerySchema, req.query, 'query');
      res.json(tasks.mine(sessionUser(req), query));
    },
  });
  const exports = [['/mine/export.xlsx', SIGNED_IN, 'mine'],
    ['/export.xlsx', PLAN_WRITERS, 'everyone']] as const;
  for (const [path, roles, whose] of exports) {
    route(router, {
      method: 'get',
      path,
      roles,
      handler: async (req, res) => {
        const query = parseInput(myTasksQuerySchema, req.query, 'query');
        const { bytes, fileName } = await tasks.exportWorkbook(sessionUser(req), whose, query);
        sendXlsx(res, bytes, fileName);
      },
    });
  }
  route(router, {
    method: 'get',
    path: '/',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const query = parseInput(myTasksQuerySchema, req.query, 'query');
      res.json(tasks.everyone(query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(tasks.detail(sessionUser(req), id));
    },
  });
  route(router, {
    method: 'patch',
    path: '/:id',
    // An owner of any role changes their task's status; the service checks the rest.
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(updateTaskSchema, req.body, 'body');
      res.json(tasks.update(sessionUser(req), id, body));
    },
  });
  route(router, {
    method: 'delete',
    path: '/:id',
    roles: PLAN_WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      tasks.remove(sessionUser(req), id);
      res.status(204).end();
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/comments',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(createTaskCommentSchema, req.body, 'body');
      res.status(201).json(tasks.comment(sessionUser(req), id, body));
    },
  });
  return router;
}
