import { Router } from 'express';
import { z } from 'zod';
import { exportAuditQuerySchema, listAuditQuerySchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { sendXlsx } from '../http/xlsx-response';
import { buildAuditWorkbook } from './audit-export';
import type { AuditService } from './audit.service';

const historyParams = z.object({
  subjectType: z.string().trim().min(1).max(40).regex(/^[a-z_]+$/, 'lower-case letters and _'),
  subjectId: z.string().trim().min(1).max(60),
});

/**
 * `/api/audit`: the whole trail and its export for administrators, and one subject's history
 * for whoever may read the subject. Read-only: there is no route that changes or deletes a
 * record (a spec walks the router stack to keep it so).
 */
export function createAuditRouter(service: AuditService, now: () => Date): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: ['admin'],
    handler: (req, res) => {
      res.json(service.list(parseInput(listAuditQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/export.xlsx',
    roles: ['admin'],
    handler: async (req, res) => {
      const query = parseInput(exportAuditQuerySchema, req.query, 'query');
      const at = now();
      const bytes = await buildAuditWorkbook(service.exportRows(query), query, at);
      sendXlsx(res, bytes, `keelson-audit-${at.toISOString().slice(0, 10)}.xlsx`);
    },
  });
  route(router, {
    method: 'get',
    path: '/history/:subjectType/:subjectId',
    // Who may read which history is decided per subject in the service.
    roles: SIGNED_IN,
    handler: (req, res) => {
      const { subjectType, subjectId } = parseInput(historyParams, req.params, 'params');
      res.json(service.history(sessionUser(req), subjectType, subjectId));
    },
  });
  return router;
}
