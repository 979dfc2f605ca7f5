import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { AuditRepository } from './audit.repository';
import { createAuditRouter } from './audit.router';
import { AuditService } from './audit.service';

/** Mounts `/api/audit`: the trail for administrators, filtered and exported, and histories. */
export function mountAuditRoutes(app: Express, deps: FeatureDeps): void {
  const service = new AuditService(new AuditRepository(deps.db));
  app.use('/api/audit', createAuditRouter(service, deps.now));
}
