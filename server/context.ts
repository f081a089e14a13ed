/** What every router, service and command receives: the database, the environment and the session handler. */
import type { PGlite } from '@electric-sql/pglite';
import { createLucia, type AuthLucia } from './auth/lucia';
import { pgliteClient, type Db, type SqlClient } from './db/client';
import type { Env } from './env';
import { InProcessJobQueue } from './jobs/InProcessJobQueue';
import type { JobQueue } from './jobs/JobQueue';
import type { FileStore } from './storage/FileStore';
import { openFileStore } from './storage/openFileStore';

/** A line logger (console.log by default, silent in tests). */
export type Log = (line: string) => void;

/** Shared state of one running server. */
export interface AppContext {
  db: Db;
  /** Raw SQL on the same database (PGlite or PostgreSQL). */
  pg: SqlClient;
  env: Env;
  lucia: AuthLucia;
  log: Log;
  /** The background-work queue (in-process on PGlite, pg-boss on PostgreSQL); see server/jobs/README.md. */
  jobs: JobQueue;
  /** Where photos, print files and generated documents are kept (a local folder, or S3); see server/storage. */
  files: FileStore;
}

/**
 * Builds the context for an opened, migrated database.
 * @param parts - the database, the environment, the logger, the job queue (in-process by default) and the file
 *   store (chosen from the environment by default)
 */
export function createContext(parts: {
  db: Db;
  pg: SqlClient | PGlite;
  env: Env;
  log?: Log;
  jobs?: JobQueue;
  files?: FileStore;
}): AppContext {
  const ctx: AppContext = {
    ...parts,
    pg: 'engine' in parts.pg ? parts.pg : pgliteClient(parts.pg),
    lucia: createLucia(parts.db),
    log: parts.log ?? ((line) => console.log(line)),
    jobs: parts.jobs ?? new InProcessJobQueue(() => ctx),
    files: parts.files ?? openFileStore(parts.env),
  };
  return ctx;
}
