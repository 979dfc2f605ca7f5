import { Router } from 'express';
import { z } from 'zod';
import {
  bomQuerySchema,
  listItemsQuerySchema,
  listNetworkVersionsQuerySchema,
  listProductsQuerySchema,
  listSuppliersQuerySchema,
} from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import type { NetworkCatalogService } from './network-catalog.service';
import type { NetworkSuppliersService } from './network-suppliers.service';
import type { NetworkVersionsService } from './network-versions.service';

const versionParams = z.object({ id: z.coerce.number().int().positive() });
const codeParams = versionParams.extend({ code: z.string().trim().min(1).max(120) });

/** The services behind `/api/network-versions`. */
export interface NetworkVersionsRouterDeps {
  versions: NetworkVersionsService;
  suppliers: NetworkSuppliersService;
  catalog: NetworkCatalogService;
}

/**
 * `/api/network-versions`: the committed networks and, inside one, its suppliers, products,
 * items and bill of materials, and the version as a workbook. Every signed-in role reads;
 * plant managers see their own plants' part (the services filter), and may not export the
 * whole network.
 */
export function createNetworkVersionsRouter(deps: NetworkVersionsRouterDeps): Router {
  const router = Router();
  const { versions, suppliers, catalog } = deps;
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(versions.list(parseInput(listNetworkVersionsQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/latest',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json(versions.latest());
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(versions.get(parseInput(versionParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/suppliers',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(versionParams, req.params, 'params');
      const query = parseInput(listSuppliersQuerySchema, req.query, 'query');
      res.json(suppliers.list(sessionUser(req), id, query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/suppliers/:code',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id, code } = parseInput(codeParams, req.params, 'params');
      res.json(suppliers.detail(sessionUser(req), id, code));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/products',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(versionParams, req.params, 'params');
      const query = parseInput(listProductsQuerySchema, req.query, 'query');
      res.json(catalog.products(sessionUser(req), id, query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/items',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id } = parseInput(versionParams, req.params, 'params');
      const query = parseInput(listItemsQuerySchema, req.query, 'query');
      res.json(catalog.items(sessionUser(req), id, query));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/bom/:code',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { id, code } = parseInput(codeParams, req.params, 'params');
      const { plant } = parseInput(bomQuerySchema, req.query, 'query');
      res.json(catalog.bom(sessionUser(req), id, code, plant));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/export.xlsx',
    // The export holds every plant's data, so it is not offered to plant managers.
    roles: ['admin', 'buyer', 'risk_manager', 'viewer'],
    handler: async (req, res) => {
      const { id } = parseInput(versionParams, req.params, 'params');
      const { bytes, fileName } = await versions.exportWorkbook(id);
      sendXlsx(res, bytes, fileName);
    },
  });
  return router;
}
