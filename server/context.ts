/** What every router, service and command receives: the database, the environment and the session handler. */
import type { PGlite } from '@electric-sql/pglite';
import { createLucia, type AuthLucia } from './auth/lucia';
import type { Db } from './db/client';
import type { Env } from './env';
import { InProcessJobQueue } from './jobs/InProcessJobQueue';
import type { JobQueue } from './jobs/JobQueue';

/** A line logger (console.log by default, silent in tests). */
export type Log = (line: string) => void;

/** Shared state of one running server. */
export interface AppContext {
  db: Db;
  pg: PGlite;
  env: Env;
  lucia: AuthLucia;
  log: Log;
  /** The background-work queue (in-process on PGlite, pg-boss on PostgreSQL); see server/jobs/README.md. */
  jobs: JobQueue;
}

/**
 * Builds the context for an opened, migrated database.
 * @param parts - the database, the environment, the logger and the job queue (in-process by default)
 */
export function createContext(parts: { db: Db; pg: PGlite; env: Env; log?: Log; jobs?: JobQueue }): AppContext {
  const ctx: AppContext = {
    ...parts,
    lucia: createLucia(parts.db),
    log: parts.log ?? ((line) => console.log(line)),
    jobs: parts.jobs ?? new InProcessJobQueue(() => ctx),
  };
  return ctx;
}
