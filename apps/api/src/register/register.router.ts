import { Router } from 'express';
import { z } from 'zod';
import {
  createRegisterEntrySchema,
  exportRegisterQuerySchema,
  listRegisterQuerySchema,
  overrideLikelihoodSchema,
  updateRegisterEntrySchema,
} from '@keelson/contracts';
import type { ScoringSettings } from '@keelson/scoring';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import { buildRegisterWorkbook } from './register-export';
import type { RegisterService } from './register.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });
const WRITERS = ['risk_manager', 'admin'] as const;

/** What the register router needs. */
export interface RegisterRouterDeps {
  register: RegisterService;
  settings: () => ScoringSettings;
  now: () => Date;
}

/**
 * `/api/register`: every signed-in role reads (plant managers the entries with one of their
 * plants; the service filters); risk managers and administrators create, edit and override.
 */
export function createRegisterRouter(deps: RegisterRouterDeps): Router {
  const router = Router();
  const { register } = deps;
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const query = parseInput(listRegisterQuerySchema, req.query, 'query');
      res.json(register.list(sessionUser(req), query));
    },
  });
  route(router, {
    method: 'get',
    path: '/export.xlsx',
    roles: SIGNED_IN,
    handler: async (req, res) => {
      const query = parseInput(exportRegisterQuerySchema, req.query, 'query');
      const now = deps.now();
      const rows = register.exportRows(sessionUser(req), query);
      const bytes = await buildRegisterWorkbook(rows, deps.settings(), now);
      sendXlsx(res, bytes, `keelson-register-${now.toISOString().slice(0, 10)}.xlsx`);
    },
  });
  route(router, {
    method: 'get',
    path: '/owners',
    // Those who assign owners; the user list itself is for administrators only.
    roles: WRITERS,
    handler: (_req, res) => {
      res.json(register.owners());
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(register.detail(sessionUser(req), id));
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: WRITERS,
    handler: (req, res) => {
      const body = parseInput(createRegisterEntrySchema, req.body, 'body');
      res.status(201).json(register.create(sessionUser(req), body));
    },
  });
  route(router, {
    method: 'patch',
    path: '/:id',
    roles: WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(updateRegisterEntrySchema, req.body, 'body');
      res.json(register.update(sessionUser(req), id, body));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/likelihood',
    roles: WRITERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(overrideLikelihoodSchema, req.body, 'body');
      res.json(register.overrideLikelihood(sessionUser(req), id, body));
    },
  });
  return router;
}
