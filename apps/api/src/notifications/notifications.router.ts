import { Router } from 'express';
import { mailPreferencesSchema, type DigestSentDto } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { MailPreferencesService } from './mail-preferences.service';

/** `/api/me/mail-preferences`: the signed-in user's choice of e-mails, for every role. */
export function createMailPreferencesRouter(preferences: MailPreferencesService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(preferences.get(sessionUser(req).id));
    },
  });
  route(router, {
    method: 'put',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      const body = parseInput(mailPreferencesSchema, req.body, 'body');
      res.json(preferences.save(sessionUser(req).id, body));
    },
  });
  return router;
}

/** `/api/admin/digest`: an administrator sends the digest of overdue tasks now. */
export function createDigestRouter(sendDigest: () => Promise<DigestSentDto>): Router {
  const router = Router();
  route(router, {
    method: 'post',
    path: '/',
    roles: ['admin'],
    handler: async (_req, res) => {
      res.json(await sendDigest());
    },
  });
  return router;
}
