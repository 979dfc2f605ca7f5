import { Router } from 'express';
import { z } from 'zod';
import { pageQuerySchema } from '@keelson/contracts';
import { parseInput } from '../http/parse-input';
import { route } from '../http/route';
import type { MailService } from './mail.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/** `/api/admin/mail`: the messages caught by the local SMTP sink. */
export function createMailRouter(service: MailService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: ['admin'],
    handler: (req, res) => {
      res.json(service.list(parseInput(pageQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: ['admin'],
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(service.get(id));
    },
  });
  return router;
}
