/** Cross-site request forgery guard: state-changing requests must come from our own origin. */
import type { RequestHandler } from 'express';
import { verifyRequestOrigin } from 'lucia';
import { HttpError } from './HttpError';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Rejects every non-GET/HEAD/OPTIONS request whose Origin header is missing or names another host than the
 * request's Host or the configured public origin: 403 `bad_origin`.
 * @param publicOrigin - PUBLIC_ORIGIN, if set
 */
export function originCheck(publicOrigin: string | undefined): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) {
      next();
      return;
    }
    const allowed = [req.get('Host'), publicOrigin].filter((value): value is string => Boolean(value));
    if (!verifyRequestOrigin(req.get('Origin') ?? '', allowed)) {
      throw new HttpError(403, 'bad_origin', 'This request did not come from the Nestwright page.');
    }
    next();
  };
}
