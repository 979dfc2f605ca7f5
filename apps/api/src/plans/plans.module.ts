import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { PlanApprovalsService } from './plan-approvals.service';
import type { PlanEvents } from './plan-events';
import { PlanViews } from './plan-views';
import { createEntryPlansRouter, createPlansRouter } from './plans.router';
import { PlansRepository } from './plans.repository';
import { PlansService } from './plans.service';
import { createTasksRouter } from './tasks.router';
import { TasksService } from './tasks.service';

/** The services of the plans feature. */
export interface PlanServices {
  plans: PlansService;
  approvals: PlanApprovalsService;
  tasks: TasksService;
}

/** Builds the plan services; `events` hears of submissions, decisions and assignments. */
export function createPlanServices(
  deps: Pick<FeatureDeps, 'db' | 'now' | 'plants'>,
  events: PlanEvents,
): PlanServices {
  const repository = new PlansRepository(deps.db);
  const views = new PlanViews(repository, deps.db, deps.now);
  const common = { repository, views, db: deps.db, now: deps.now };
  return {
    plans: new PlansService(common),
    approvals: new PlanApprovalsService({ ...common, plants: deps.plants, events }),
    tasks: new TasksService({ ...common, events }),
  };
}

/**
 * Mounts `/api/register/:entryId/plans`, `/api/plans` (plans, the what-if, submission,
 * decisions) and `/api/tasks` (tasks, comments, my tasks).
 */
export function mountPlanRoutes(app: Express, deps: FeatureDeps, events: PlanEvents): void {
  const services = createPlanServices(deps, events);
  app.use('/api/register/:entryId/plans', createEntryPlansRouter(services));
  app.use('/api/plans', createPlansRouter(services));
  app.use('/api/tasks', createTasksRouter(services.tasks));
}
