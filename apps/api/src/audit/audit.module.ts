import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';

/** Mounts `/api/audit`: the trail for administrators, filtered and exported, and histories. */
export function mountAuditRoutes(_app: Express, _deps: FeatureDeps): void {
  // Filled in by the audit feature.
}
