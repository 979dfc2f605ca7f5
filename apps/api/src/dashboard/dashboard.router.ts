import { Router } from 'express';
import { sessionUser } from '../http/auth-context';
import { route, SIGNED_IN } from '../http/route';
import type { DashboardService } from './dashboard.service';

/** `/api/dashboard`: every signed-in role reads the figures of its own home page. */
export function createDashboardRouter(dashboard: DashboardService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(dashboard.forUser(sessionUser(req)));
    },
  });
  return router;
}
