/** What every router, service and command receives: the database, the environment and the session handler. */
import type { PGlite } from '@electric-sql/pglite';
import { createLucia, type AuthLucia } from './auth/lucia';
import type { Db } from './db/client';
import type { Env } from './env';

/** A line logger (console.log by default, silent in tests). */
export type Log = (line: string) => void;

/** Shared state of one running server. */
export interface AppContext {
  db: Db;
  pg: PGlite;
  env: Env;
  lucia: AuthLucia;
  log: Log;
}

/**
 * Builds the context for an opened, migrated database.
 * @param parts - the database, the environment and the logger
 */
export function createContext(parts: { db: Db; pg: PGlite; env: Env; log?: Log }): AppContext {
  return { ...parts, lucia: createLucia(parts.db), log: parts.log ?? ((line) => console.log(line)) };
}
