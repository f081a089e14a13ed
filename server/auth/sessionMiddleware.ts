/** Reads the session cookie on every API request and puts the signed-in person on res.locals. */
import type { RequestHandler } from 'express';
import type { Person } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { rememberSession, rememberedSession } from './sessionCache';
import { clearSessionCookie, setSessionCookie } from './sessionCookie';

/**
 * Validates the session cookie (a session validated in the last few seconds is taken from ./sessionCache, and
 * requests arriving together with one cookie share one validation): sets `res.locals.person` and
 * `res.locals.sessionId` when valid, renews the cookie when lucia extended the session, clears it when the session is
 * unknown or expired.
 * @param ctx - app context
 */
export function sessionMiddleware(ctx: AppContext): RequestHandler {
  // Validations under way, by session id: requests that arrive together with one cookie share one database check.
  const validating = new Map<string, ReturnType<typeof ctx.lucia.validateSession>>();
  return async (req, res, next) => {
    const sessionId = ctx.lucia.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) {
      next();
      return;
    }
    const remembered = rememberedSession(ctx.db, sessionId);
    if (remembered) {
      res.locals.person = remembered;
      res.locals.sessionId = sessionId;
      next();
      return;
    }
    let validation = validating.get(sessionId);
    if (!validation) {
      validation = ctx.lucia.validateSession(sessionId).finally(() => validating.delete(sessionId));
      validating.set(sessionId, validation);
    }
    const { session, user } = await validation;
    // Deactivating ends every session; this also turns away one created in the same instant.
    if (!session || user.deactivatedAt) {
      if (session) await ctx.lucia.invalidateSession(session.id);
      clearSessionCookie(ctx, req, res);
      next();
      return;
    }
    if (session.fresh) setSessionCookie(ctx, req, res, session.id);
    const person: Person = { id: user.id, email: user.email, name: user.name, roles: user.roles };
    rememberSession(ctx.db, session.id, person, session.expiresAt);
    res.locals.person = person;
    res.locals.sessionId = session.id;
    next();
  };
}
