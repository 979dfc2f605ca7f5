import { Router } from 'express';
import { z } from 'zod';
import { loginRequestSchema, setPasswordRequestSchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { AuthService } from './auth.service';
import {
  addressRateLimiter,
  loginRateLimiters,
  type LoginRateLimits,
} from './login-rate-limits';
import { clearSessionCookie, setSessionCookie } from './session-cookie';

const tokenParams = z.object({ token: z.string().min(10).max(200) });

/** What the auth router needs. */
export interface AuthRouterOptions {
  isSecureCookie: boolean;
  rateLimits: LoginRateLimits;
}

/** `/api/auth`: sign in and out, the current user, invitations. */
export function createAuthRouter(service: AuthService, options: AuthRouterOptions): Router {
  const router = Router();
  const invitationLimiter = addressRateLimiter(options.rateLimits);
  route(router, {
    method: 'post',
    path: '/login',
    roles: 'public',
    csrf: 'always',
    before: loginRateLimiters(options.rateLimits),
    handler: async (req, res) => {
      const { email, password } = parseInput(loginRequestSchema, req.body, 'body');
      const answer = await service.login(email, password);
      setSessionCookie(res, answer.token, options.isSecureCookie);
      res.json(answer);
    },
  });
  route(router, {
    method: 'post',
    path: '/logout',
    roles: 'public',
    handler: (_req, res) => {
      clearSessionCookie(res, options.isSecureCookie);
      res.status(204).end();
    },
  });
  route(router, {
    method: 'get',
    path: '/me',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json({ user: service.me(sessionUser(req).id) });
    },
  });
  route(router, {
    method: 'get',
    path: '/invitations/:token',
    roles: 'public',
    before: [invitationLimiter],
    handler: (req, res) => {
      const { token } = parseInput(tokenParams, req.params, 'params');
      res.json(service.invitation(token));
    },
  });
  route(router, {
    method: 'post',
    path: '/set-password',
    roles: 'public',
    csrf: 'always',
    before: [invitationLimiter],
    handler: async (req, res) => {
      const body = parseInput(setPasswordRequestSchema, req.body, 'body');
      res.json({ user: await service.setPassword(body.token, body.password) });
    },
  });
  return router;
}
