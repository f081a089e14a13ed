/**
 * vitest global setup: runs once per test run. Creates an in-memory database, applies the real migrations, seeds
 * it, and dumps it to temporary files whose paths tests read with `inject('pgSnapshotPath')` (seeded) and
 * `inject('pgMigratedSnapshotPath')` (migrated, never seeded); see ./testApp.ts. With TEST_DATABASE_URL it makes
 * PostgreSQL template databases instead (./postgresTestDb.ts).
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { migrateDatabase, openDatabase, openPostgres } from '../../server/db/client';
import { adminSql, databaseUrl, dropDatabase, TEST_DATABASE_URL } from './postgresTestDb';
import { seedIfNew } from '../../server/db/seed';

declare module 'vitest' {
  export interface ProvidedContext {
    /** File holding a `dumpDataDir()` of a migrated and seeded database. */
    pgSnapshotPath: string;
    /** File holding a `dumpDataDir()` of a migrated database that was never seeded (a "new" database). */
    pgMigratedSnapshotPath: string;
    /** On PostgreSQL (TEST_DATABASE_URL): the template database that is migrated and seeded. */
    pgSeededTemplate: string;
    /** On PostgreSQL: the template database that is migrated, never seeded. */
    pgMigratedTemplate: string;
  }
}

/** Builds the snapshot and provides its path; the returned teardown removes it. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (TEST_DATABASE_URL) return setupPostgres(project);
  const started = performance.now();
  const { pg, db } = await openDatabase();
  await migrateDatabase(db);
  const dir = await mkdtemp(join(tmpdir(), 'nestwright-test-'));
  const migratedPath = join(dir, 'migrated.tar');
  await writeFile(migratedPath, Buffer.from(await (await pg.dumpDataDir('none')).arrayBuffer()));
  await seedIfNew(db, { SEED_DEMO: true }, () => {});
  const seededPath = join(dir, 'seeded.tar');
  await writeFile(seededPath, Buffer.from(await (await pg.dumpDataDir('none')).arrayBuffer()));
  await pg.close();
  project.provide('pgSnapshotPath', seededPath);
  project.provide('pgMigratedSnapshotPath', migratedPath);
  console.log(`[global setup] migrated and seeded snapshots in ${Math.round(performance.now() - started)} ms`);
  return async () => {
    await rm(dir, { recursive: true, force: true });
  };
}

/** PostgreSQL: two template databases (migrated; migrated and seeded) that test apps copy. */
async function setupPostgres(project: TestProject): Promise<() => Promise<void>> {
  const started = performance.now();
  const run = `${process.pid}_${Date.now().toString(36)}`;
  const migrated = `nwt_migrated_${run}`;
  const seeded = `nwt_seeded_${run}`;
  await adminSql(`create database ${migrated}`);
  const opened = openPostgres({ url: databaseUrl(migrated), poolMax: 2, statementTimeoutMs: 0 });
  await migrateDatabase(opened.db);
  await opened.pg.close();
  await adminSql(`create database ${seeded} template ${migrated}`);
  const seeding = openPostgres({ url: databaseUrl(seeded), poolMax: 2, statementTimeoutMs: 0 });
  await seedIfNew(seeding.db, { SEED_DEMO: true }, () => {});
  await seeding.pg.close();
  project.provide('pgSeededTemplate', seeded);
  project.provide('pgMigratedTemplate', migrated);
  project.provide('pgSnapshotPath', '');
  project.provide('pgMigratedSnapshotPath', '');
  console.log(`[global setup] PostgreSQL template databases in ${Math.round(performance.now() - started)} ms`);
  return async () => {
    await dropDatabase(seeded);
    await dropDatabase(migrated);
  };
}
