/** Writing the session cookie: HttpOnly, SameSite=Lax, Path=/, Secure when the request arrived over HTTPS. */
import type { Request, Response } from 'express';
import { Cookie } from 'lucia';
import type { AppContext } from '../context';

function isSecure(ctx: AppContext, req: Request): boolean {
  return req.secure || (ctx.env.PUBLIC_ORIGIN?.startsWith('https:') ?? false);
}

function append(ctx: AppContext, req: Request, res: Response, cookie: Cookie): void {
  const secured = new Cookie(cookie.name, cookie.value, { ...cookie.attributes, secure: isSecure(ctx, req) });
  res.append('Set-Cookie', secured.serialize());
}

/**
 * Sets the cookie for a (new or renewed) session.
 * @param ctx - app context (lucia, env)
 * @param req - the request (is it HTTPS?)
 * @param res - the response to add the cookie to
 * @param sessionId - the session id
 */
export function setSessionCookie(ctx: AppContext, req: Request, res: Response, sessionId: string): void {
  append(ctx, req, res, ctx.lucia.createSessionCookie(sessionId));
}

/**
 * Clears the session cookie (sign-out, expired or unknown session).
 * @param ctx - app context
 * @param req - the request
 * @param res - the response to add the cookie to
 */
export function clearSessionCookie(ctx: AppContext, req: Request, res: Response): void {
  append(ctx, req, res, ctx.lucia.createBlankSessionCookie());
}
