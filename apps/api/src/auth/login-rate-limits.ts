import type { Request, RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { AppError } from '../http/app-error';

/** Limits of the sign-in and set-password routes. */
export interface LoginRateLimits {
  windowMs: number;
  /** Requests per client address per window (all outcomes). */
  perAddress: number;
  /** Failed sign-ins per e-mail address per window. */
  failuresPerAccount: number;
}

/** Defaults of {@link LoginRateLimits}: 30 per address, 8 failures per account, 15 minutes. */
export const LOGIN_RATE_LIMIT_DEFAULTS: LoginRateLimits = {
  windowMs: 15 * 60 * 1000,
  perAddress: 30,
  failuresPerAccount: 8,
};

function tooMany(message: string): RequestHandler {
  return (_req, _res, next) => next(new AppError('too_many_requests', 429, message));
}

function emailOf(req: Request): string | undefined {
  const email: unknown = req.body?.email;
  return typeof email === 'string' && email.trim() !== '' ? email.trim().toLowerCase() : undefined;
}

/**
 * The two sign-in limiters, in order: per client address (all requests) and per account e-mail
 * (failed attempts only, `skipSuccessfulRequests`), so one address cannot guess many accounts and
 * many addresses cannot guess one. A refusal is a 429 with the usual error body.
 */
export function loginRateLimiters(limits: LoginRateLimits): RequestHandler[] {
  const byAddress = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (req, res, next) =>
      tooMany('Too many sign-in attempts from your address. Wait a few minutes and try again.')(
        req,
        res,
        next,
      ),
  });
  const byAccount = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.failuresPerAccount,
    standardHeaders: false,
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    skip: (req) => emailOf(req) === undefined,
    keyGenerator: (req) => `account:${emailOf(req)}`,
    handler: (req, res, next) =>
      tooMany('Too many failed sign-ins for this account. Wait a few minutes and try again.')(
        req,
        res,
        next,
      ),
  });
  return [byAddress, byAccount];
}

/** One per-address limiter for other unauthenticated routes (invitation look-ups). */
export function addressRateLimiter(limits: LoginRateLimits): RequestHandler {
  return rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (req, res, next) =>
      tooMany('Too many requests from your address. Wait a few minutes and try again.')(
        req,
        res,
        next,
      ),
  });
}
