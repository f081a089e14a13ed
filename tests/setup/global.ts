/**
 * vitest global setup: runs once per test run. Creates an in-memory database, applies the real migrations, seeds
 * it, and dumps it to temporary files whose paths tests read with `inject('pgSnapshotPath')` (seeded) and
 * `inject('pgMigratedSnapshotPath')` (migrated, never seeded); see ./testApp.ts.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { migrateDatabase, openDatabase } from '../../server/db/client';
import { seedIfNew } from '../../server/db/seed';

declare module 'vitest' {
  export interface ProvidedContext {
    /** File holding a `dumpDataDir()` of a migrated and seeded database. */
    pgSnapshotPath: string;
    /** File holding a `dumpDataDir()` of a migrated database that was never seeded (a "new" database). */
    pgMigratedSnapshotPath: string;
  }
}

/** Builds the snapshot and provides its path; the returned teardown removes it. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
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
