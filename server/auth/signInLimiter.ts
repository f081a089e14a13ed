/** Slows password guessing: at most 10 failed sign-ins per 15 minutes for one address + e-mail. */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Db } from '../db/client';
import { HttpError } from '../http/HttpError';
import { DbRateLimitStore } from './DbRateLimitStore';

/** Failed attempts allowed per window. */
export const SIGN_IN_ATTEMPTS = 10;
/** The window, in milliseconds. */
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/**
 * The sign-in limiter of an app. Counts live in the database (`rate_limit_hits`), so the limit holds across every
 * API process sharing it (and each test app, with its own database, has its own counts). Must run after the JSON
 * parser. Successful sign-ins do not count.
 * @param db - the app's database
 */
export function signInLimiter(db: Db): RequestHandler {
  return rateLimit({
    store: new DbRateLimitStore(db, 'sign-in:'),
    windowMs: SIGN_IN_WINDOW_MS,
    limit: SIGN_IN_ATTEMPTS,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const body = req.body as { email?: unknown } | undefined;
      const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase().slice(0, 254) : '';
      return `${ipKeyGenerator(req.ip ?? 'unknown')}|${email}`;
    },
    handler: (_req, _res, next) => {
      next(new HttpError(429, 'too_many_attempts', 'Too many sign-in attempts. Wait 15 minutes and try again.'));
    },
  });
}
