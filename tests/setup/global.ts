/**
 * vitest global setup: runs once per test run. Creates an in-memory database, applies the real migrations, seeds
 * it, and dumps it to a temporary file whose path tests read with `inject('pgSnapshotPath')` (see ./testApp.ts).
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
  }
}

/** Builds the snapshot and provides its path; the returned teardown removes it. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const started = performance.now();
  const { pg, db } = await openDatabase();
  await migrateDatabase(db);
  await seedIfNew(db, { SEED_DEMO: true }, () => {});
  const dump = await pg.dumpDataDir('none');
  await pg.close();
  const dir = await mkdtemp(join(tmpdir(), 'nestwright-test-'));
  const path = join(dir, 'seeded.tar');
  await writeFile(path, Buffer.from(await dump.arrayBuffer()));
  project.provide('pgSnapshotPath', path);
  console.log(`[global setup] migrated + seeded snapshot in ${Math.round(performance.now() - started)} ms`);
  return async () => {
    await rm(dir, { recursive: true, force: true });
  };
}
