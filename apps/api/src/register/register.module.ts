import type { Express } from 'express';
import type { FeatureDeps } from '../feature-deps';
import { loadScoringSettings } from '../settings/scoring-settings.repository';
import { createScoringSettingsRouter } from '../settings/scoring-settings.router';
import { ScoringSettingsService } from '../settings/scoring-settings.service';
import { createRegisterRouter } from './register.router';
import { RegisterRepository } from './register.repository';
import { RegisterService } from './register.service';

/**
 * Mounts `/api/register` (the risk register and its export) and `/api/settings/scoring` (the
 * scoring settings; a change re-scores the register in the same transaction).
 */
export function mountRegisterRoutes(app: Express, deps: FeatureDeps): void {
  const register = new RegisterService({
    repository: new RegisterRepository(deps.db),
    db: deps.db,
    now: deps.now,
  });
  const settings = new ScoringSettingsService({
    db: deps.db,
    now: deps.now,
    afterChange: (changed) => {
      const rescored = register.rescoreAll(changed);
      deps.logger.info({ rescored }, 'scoring settings changed; register re-scored');
      return rescored;
    },
  });
  app.use('/api/register', createRegisterRouter({
    register,
    settings: () => loadScoringSettings(deps.db),
    now: deps.now,
  }));
  app.use('/api/settings/scoring', createScoringSettingsRouter(settings));
}
