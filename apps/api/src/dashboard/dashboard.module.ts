import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { DashboardRepository } from './dashboard.repository';
import { createDashboardRouter } from './dashboard.router';
import { DashboardService } from './dashboard.service';

/** Mounts `/api/dashboard`: the home page's figures for the signed-in user's role. */
export function mountDashboardRoutes(app: Express, deps: FeatureDeps): void {
  const dashboard = new DashboardService({
    repository: new DashboardRepository(deps.db),
    now: deps.now,
  });
  app.use('/api/dashboard', createDashboardRouter(dashboard));
}
