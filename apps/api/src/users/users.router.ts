import { Router } from 'express';
import { z } from 'zod';
import {
  inviteUserRequestSchema,
  listUsersQuerySchema,
  updateUserRequestSchema,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route } from '../http/route';
import type { UsersService } from './users.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/** `/api/users`: user administration, for administrators only. */
export function createUsersRouter(service: UsersService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: ['admin'],
    handler: (req, res) => {
      res.json(service.list(parseInput(listUsersQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'post',
    path: '/invitations',
    roles: ['admin'],
    handler: async (req, res) => {
      const body = parseInput(inviteUserRequestSchema, req.body, 'body');
      const user = await service.invite(sessionUser(req), body);
      res.status(201).json({ user });
    },
  });
  route(router, {
    method: 'patch',
    path: '/:id',
    roles: ['admin'],
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(updateUserRequestSchema, req.body, 'body');
      res.json({ user: service.update(sessionUser(req), id, body) });
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/invitations',
    roles: ['admin'],
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      await service.resendInvitation(sessionUser(req), id);
      res.status(204).end();
    },
  });
  return router;
}
