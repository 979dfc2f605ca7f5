import { Router } from 'express';
import { z } from 'zod';
import { comparisonQuerySchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import { buildComparisonWorkbook } from './comparison-export';
import type { ComparisonService } from './comparison.service';

const entryParams = z.object({ entryId: z.coerce.number().int().positive() });

/** What the comparison router needs. */
export interface ComparisonRouterDeps {
  comparison: ComparisonService;
  now: () => Date;
}

/**
 * `/api/comparison`: what changed between two runs (`?from=&to=`, both optional), the same as
 * a workbook, the quarterly trends and one register entry's score per re-scoring. Every
 * signed-in role reads; plant managers within their plants (filtered in the service).
 */
export function createComparisonRouter(deps: ComparisonRouterDeps): Router {
  const router = Router();
  const { comparison } = deps;
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const query = parseInput(comparisonQuerySchema, req.query, 'query');
      res.json(comparison.compare(sessionUser(req), query));
    },
  });
  route(router, {
    method: 'get',
    path: '/export.xlsx',
    roles: SIGNED_IN,
    handler: async (req, res) => {
      const query = parseInput(comparisonQuerySchema, req.query, 'query');
      const result = comparison.compare(sessionUser(req), query);
      const bytes = await buildComparisonWorkbook(result, deps.now());
      sendXlsx(res, bytes, `keelson-comparison-${result.fromRun.id}-${result.toRun.id}.xlsx`);
    },
  });
  route(router, {
    method: 'get',
    path: '/trends',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(comparison.trends(sessionUser(req)));
    },
  });
  route(router, {
    method: 'get',
    path: '/entries/:entryId/scores',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { entryId } = parseInput(entryParams, req.params, 'params');
      res.json(comparison.entryScores(sessionUser(req), entryId));
    },
  });
  return router;
}
