/** Sign-in, sign-out and "who am I". */
import { Router } from 'express';
import { SignInSchema, type Me, type SignIn } from '../../shared/schemas/auth';
import { decoyPasswordHash, verifyPassword } from '../auth/password';
import { requireAuth, signedInPerson } from '../auth/requireRole';
import { clearSessionCookie, setSessionCookie } from '../auth/sessionCookie';
import { signInLimiter } from '../auth/signInLimiter';
import type { AppContext } from '../context';
import { HttpError } from '../http/HttpError';
import { parsedBody, validate } from '../http/validate';
import { findPersonByEmail, toPerson } from '../services/people';

/** The same answer for an unknown e-mail and a wrong password, so the form does not reveal who has an account. */
const invalidCredentials = (): HttpError =>
  new HttpError(401, 'invalid_credentials', 'The e-mail address or the password is wrong.');

/**
 * `/api/auth`: `POST /sign-in` `{ email, password }` -> `{ person }` + session cookie; `POST /sign-out` -> 204
 * (also when already signed out); `GET /me` -> `{ person }` or 401.
 * @param ctx - app context
 */
export function authRouter(ctx: AppContext): Router {
  const router = Router();

  router.post('/sign-in', signInLimiter(ctx.db), validate({ body: SignInSchema }), async (req, res) => {
    const { email, password } = parsedBody<SignIn>(res);
    const row = await findPersonByEmail(ctx.db, email);
    const valid = await verifyPassword(row?.passwordHash ?? (await decoyPasswordHash()), password);
    if (!row || !valid) throw invalidCredentials();
    if (res.locals.sessionId) await ctx.lucia.invalidateSession(res.locals.sessionId as string);
    const session = await ctx.lucia.createSession(row.id, {});
    setSessionCookie(ctx, req, res, session.id);
    const body: Me = { person: toPerson(row) };
    res.json(body);
  });

  router.post('/sign-out', async (req, res) => {
    if (res.locals.sessionId) await ctx.lucia.invalidateSession(res.locals.sessionId as string);
    clearSessionCookie(ctx, req, res);
    res.status(204).end();
  });

  router.get('/me', requireAuth, (_req, res) => {
    const body: Me = { person: signedInPerson(res) };
    res.json(body);
  });

  return router;
}
