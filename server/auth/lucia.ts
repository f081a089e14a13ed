/** lucia session handling over the Drizzle adapter: sessions live in the `sessions` table. */
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { Db } from '../db/client';
import { forgetSessions } from './sessionCache';
import { people, sessions, type PersonRow } from '../db/schema';

/**
 * How long a session lasts without use. lucia renews ("fresh" session) when less than half of it is left, so an
 * active person stays signed in and an idle one is signed out after this span.
 */
export const SESSION_LIFETIME = new TimeSpan(14, 'd');

/** Name of the session cookie. */
export const SESSION_COOKIE_NAME = 'nestwright_session';

/**
 * Creates the lucia instance for one database.
 * @param db - the database holding `people` and `sessions`
 */
export function createLucia(db: Db) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessions, people);
  const lucia = new Lucia(adapter, {
    sessionExpiresIn: SESSION_LIFETIME,
    sessionCookie: {
      name: SESSION_COOKIE_NAME,
      expires: true,
      // Secure is decided per request (HTTPS or an https PUBLIC_ORIGIN) in ./sessionCookie.ts.
      attributes: { sameSite: 'lax', secure: false },
    },
    getUserAttributes: (attributes) => ({
      email: attributes.email,
      name: attributes.name,
      roles: attributes.roles,
      deactivatedAt: attributes.deactivatedAt,
    }),
  });
  // Every way a session ends (sign-out, deactivation, a new password) also empties the in-process memory of valid
  // sessions (./sessionCache), before and after the database, so that a request in between cannot keep it alive.
  const invalidateSession = lucia.invalidateSession.bind(lucia);
  const invalidateUserSessions = lucia.invalidateUserSessions.bind(lucia);
  lucia.invalidateSession = async (sessionId) => {
    forgetSessions(db, sessionId);
    await invalidateSession(sessionId);
    forgetSessions(db, sessionId);
  };
  lucia.invalidateUserSessions = async (userId) => {
    forgetSessions(db);
    await invalidateUserSessions(userId);
    forgetSessions(db);
  };
  return lucia;
}

/** The lucia instance type. */
export type AuthLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: AuthLucia;
    DatabaseUserAttributes: Omit<PersonRow, 'id'>;
  }
}
