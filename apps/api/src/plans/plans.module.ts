import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import type { PlanEvents } from './plan-events';

/**
 * Mounts `/api/register/:entryId/plans`, `/api/plans` (plans, the what-if, submission,
 * decisions) and `/api/tasks` (tasks, comments, my tasks).
 */
export function mountPlanRoutes(_app: Express, _deps: FeatureDeps, _events: PlanEvents): void {
  // Filled in by the plans feature.
}
