/** Opening the PGlite database through Drizzle and applying the committed migrations. */
import { PGlite } from '@electric-sql/pglite';
import { drizzle, type PgliteDatabase } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as schema from './schema';

/** The Drizzle database every query goes through. */
export type Db = PgliteDatabase<typeof schema>;

/** The committed migrations (drizzle/ at the repository root). */
export const MIGRATIONS_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '../../drizzle');

/** Where and how to open the database. */
export interface OpenDatabaseOptions {
  /** DATA_DIR; the database lives in `${dataDir}/pg`. Undefined opens an in-memory database. */
  dataDir?: string;
  /** A `dumpDataDir()` snapshot to start from (tests). */
  loadDataDir?: Blob | File;
}

/**
 * Opens (creating if needed) the PGlite database and wraps it in Drizzle. Does not migrate.
 * @param options - where the data lives
 */
export async function openDatabase(options: OpenDatabaseOptions = {}): Promise<{ pg: PGlite; db: Db }> {
  let path: string | undefined;
  if (options.dataDir !== undefined) {
    path = join(resolve(options.dataDir), 'pg');
    mkdirSync(path, { recursive: true });
  }
  const pg = await PGlite.create(path, options.loadDataDir ? { loadDataDir: options.loadDataDir } : {});
  return { pg, db: drizzle(pg, { schema }) };
}

/**
 * Applies every migration in drizzle/ that this database has not seen yet.
 * @param db - the database to migrate
 */
export async function migrateDatabase(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
}

/** The database or an open transaction: what named queries accept when they may run inside a transaction. */
export type Queryable = Pick<Db, 'select' | 'insert' | 'update' | 'delete' | 'execute'>;
