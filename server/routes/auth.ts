/** Sign-in, sign-out and "who am I". */
import { Router } from 'express';
import {
  PasswordChangeSchema,
  SignInSchema,
  type Me,
  type PasswordChange,
  type SignIn,
} from '../../shared/schemas/auth';
import { decoyPasswordHash, verifyPassword } from '../auth/password';
import { requireAuth, signedInPerson } from '../auth/requireRole';
import { clearSessionCookie, setSessionCookie } from '../auth/sessionCookie';
import { signInLimiter } from '../auth/signInLimiter';
import type { AppContext } from '../context';
import { HttpError } from '../http/HttpError';
import { parsedBody, validate } from '../http/validate';
import { findPersonByEmail, setPassword, toPerson } from '../services/people';
import { eq } from 'drizzle-orm';
import { people } from '../db/schema';
import { getStudio } from '../services/studio';

/** The same answer for an unknown e-mail and a wrong password, so the form does not reveal who has an account. */
const invalidCredentials = (): HttpError =>
  new HttpError(401, 'invalid_credentials', 'The e-mail address or the password is wrong.');

/**
 * `/api/auth`: `POST /sign-in` `{ email, password }` -> `{ person }` + session cookie; `POST /sign-out` -> 204
 * (also when already signed out); `GET /me` -> `{ person }` or 401;
 * `POST /password` `{ currentPassword, newPassword }` -> 204: the signed-in person's new password; their other
 * sessions end. A deactivated person's right password gets 403 `account_deactivated`.
 * @param ctx - app context
 */
export function authRouter(ctx: AppContext): Router {
  const router = Router();

  router.post('/sign-in', signInLimiter(ctx.db), validate({ body: SignInSchema }), async (req, res) => {
    const { email, password } = parsedBody<SignIn>(res);
    const row = await findPersonByEmail(ctx.db, email);
    const valid = await verifyPassword(row?.passwordHash ?? (await decoyPasswordHash()), password);
    if (!row || !valid) throw invalidCredentials();
    // Said only after the right password, so the message reveals nothing to someone guessing.
    if (row.deactivatedAt !== null)
      throw new HttpError(
        403,
        'account_deactivated',
        'This account has been deactivated. Ask your studio admin if you need to sign in again.',
      );
    if (res.locals.sessionId) await ctx.lucia.invalidateSession(res.locals.sessionId as string);
    const session = await ctx.lucia.createSession(row.id, {});
    setSessionCookie(ctx, req, res, session.id);
    const studio = await getStudio(ctx.db);
    const body: Me = { person: toPerson(row), studioName: studio.name, locale: studio.locale };
    res.json(body);
  });

  router.post('/sign-out', async (req, res) => {
    if (res.locals.sessionId) await ctx.lucia.invalidateSession(res.locals.sessionId as string);
    clearSessionCookie(ctx, req, res);
    res.status(204).end();
  });

  router.post('/password', requireAuth, validate({ body: PasswordChangeSchema }), async (req, res) => {
    const { currentPassword, newPassword } = parsedBody<PasswordChange>(res);
    const me = signedInPerson(res);
    const [row] = await ctx.db.select({ passwordHash: people.passwordHash }).from(people).where(eq(people.id, me.id));
    if (!row || !(await verifyPassword(row.passwordHash, currentPassword)))
      throw new HttpError(400, 'wrong_password', 'The current password is not right.', [
        { in: 'body', path: 'currentPassword', message: 'The current password is not right.' },
      ]);
    await setPassword(ctx.db, me.id, newPassword, me.id, 'person.password_changed');
    // Every other device is signed out; this one gets a new session.
    await ctx.lucia.invalidateUserSessions(me.id);
    const session = await ctx.lucia.createSession(me.id, {});
    setSessionCookie(ctx, req, res, session.id);
    res.status(204).end();
  });

  router.get('/me', requireAuth, async (_req, res) => {
    const studio = await getStudio(ctx.db);
    const body: Me = { person: signedInPerson(res), studioName: studio.name, locale: studio.locale };
    res.json(body);
  });

  return router;
}
