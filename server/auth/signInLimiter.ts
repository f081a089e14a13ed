/** Slows password guessing: at most 10 failed sign-ins per 15 minutes for one address + e-mail. */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { HttpError } from '../http/HttpError';

/** Failed attempts allowed per window. */
export const SIGN_IN_ATTEMPTS = 10;
/** The window, in milliseconds. */
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/**
 * A fresh limiter (memory store; one per app so tests do not share counts). Must run after the JSON parser.
 * Successful sign-ins do not count.
 */
export function signInLimiter(): RequestHandler {
  return rateLimit({
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
