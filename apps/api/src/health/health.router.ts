import { Router } from 'express';
import { route } from '../http/route';
import type { HealthService } from './health.service';

/** `/api/health`: public; 200 when healthy, 503 otherwise (same body shape). */
export function createHealthRouter(service: HealthService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: 'public',
    handler: (_req, res) => {
      const report = service.check();
      res.status(report.status === 'ok' ? 200 : 503).json(report);
    },
  });
  return router;
}
