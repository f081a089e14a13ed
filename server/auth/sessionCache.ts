/**
 * A short-lived in-process memory of valid sessions, so that a signed-in read does not query the database for its
 * session on every request (on PGlite that query costs more than the rest of a cached answer).
 *
 * A remembered session is trusted for {@link SESSION_CACHE_MS} at most, and never past its expiry. Ending a session
 * through lucia (sign-out, a new sign-in, deactivation, a new password: see ./lucia.ts) forgets it at once; a change
 * to a person (roles, name) forgets every session. A session ended by another API process on the same PostgreSQL
 * database is turned away here within {@link SESSION_CACHE_MS}.
 */
import type { Person } from '../../shared/schemas/auth';
import type { Db } from '../db/client';

/** Longest time a session is trusted without asking the database again (ms). */
export const SESSION_CACHE_MS = 5000;

/** Most sessions remembered; past it the memory is emptied (the next requests ask the database again). */
const MAX_SESSIONS = 10_000;

interface RememberedSession {
  person: Person;
  /** When to ask the database again (performance.now() ms). */
  until: number;
  /** The session's own expiry (epoch ms). */
  expiresAtMs: number;
}

const memories = new WeakMap<Db, Map<string, RememberedSession>>();

function memoryOf(db: Db): Map<string, RememberedSession> {
  let memory = memories.get(db);
  if (!memory) {
    memory = new Map();
    memories.set(db, memory);
  }
  return memory;
}

/**
 * The person of a remembered, still valid session, or undefined (then validate it against the database).
 * @param db - the database the sessions are kept in (`ctx.db`)
 * @param sessionId - the session id from the cookie
 */
export function rememberedSession(db: Db, sessionId: string): Person | undefined {
  const memory = memoryOf(db);
  const hit = memory.get(sessionId);
  if (!hit) return undefined;
  if (hit.until <= performance.now() || hit.expiresAtMs <= Date.now()) {
    memory.delete(sessionId);
    return undefined;
  }
  return hit.person;
}

/**
 * Remembers a session the database has just validated.
 * @param db - the database (`ctx.db`)
 * @param sessionId - the session id
 * @param person - its person
 * @param expiresAt - the session's expiry
 */
export function rememberSession(db: Db, sessionId: string, person: Person, expiresAt: Date): void {
  const memory = memoryOf(db);
  if (memory.size >= MAX_SESSIONS) memory.clear();
  memory.set(sessionId, { person, until: performance.now() + SESSION_CACHE_MS, expiresAtMs: expiresAt.getTime() });
}

/**
 * Forgets one session (sign-out, a new sign-in) or, without an id, every session (a person's roles changed).
 * @param db - the database (`ctx.db`)
 * @param sessionId - the session to forget; omitted: all of them
 */
export function forgetSessions(db: Db, sessionId?: string): void {
  if (sessionId === undefined) memoryOf(db).clear();
  else memoryOf(db).delete(sessionId);
}
