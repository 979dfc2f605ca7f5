import { Router } from 'express';
import { scoringSettingsSchema, type ScoringSettings } from '@keelson/scoring';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { ScoringSettingsService } from './scoring-settings.service';

/** Response header that says how many register entries a settings change re-scored. */
export const RESCORED_HEADER = 'x-keelson-rescored';

/**
 * `/api/settings/scoring`: GET (every role) answers the `ScoringSettings`; PUT (administrators)
 * takes a whole `ScoringSettings`, answers the saved settings, and says in
 * {@link RESCORED_HEADER} how many register entries changed rating or band.
 */
export function createScoringSettingsRouter(service: ScoringSettingsService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json(service.current());
    },
  });
  route(router, {
    method: 'put',
    path: '/',
    roles: ['admin'],
    handler: (req, res) => {
      const body = parseInput(scoringSettingsSchema, req.body, 'body') as ScoringSettings;
      const { settings, rescored } = service.replace(body, sessionUser(req).id);
      res.setHeader(RESCORED_HEADER, String(rescored));
      res.json(settings);
    },
  });
  return router;
}
