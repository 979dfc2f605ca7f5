import { Router } from 'express';
import { z } from 'zod';
import { saveImportMappingSchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { ImportMappingsService } from './import-mappings.service';
import { IMPORT_WRITERS } from './imports.router';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/** `/api/import-mappings`: saved column mappings (buyers and admins save and delete). */
export function createImportMappingsRouter(service: ImportMappingsService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json(service.list());
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: IMPORT_WRITERS,
    handler: (req, res) => {
      const body = parseInput(saveImportMappingSchema, req.body, 'body');
      res.status(201).json(service.save(sessionUser(req), body));
    },
  });
  route(router, {
    method: 'delete',
    path: '/:id',
    roles: IMPORT_WRITERS,
    handler: (req, res) => {
      service.remove(parseInput(idParams, req.params, 'params').id);
      res.status(204).end();
    },
  });
  return router;
}
