/** Seeding a new database: runs the registered steps once, resuming after a crash, never on a finished database. */
import { inArray } from 'drizzle-orm';
import type { Log } from '../context';
import type { Env } from '../env';
import type { Db } from './client';
import { seedRuns } from './schema';
import { registeredSeedSteps } from './seedRegistry';
import './seedSteps';

/** Name recorded once every step has run: from then on the database is not new. */
const SEEDING_COMPLETE = 'seeding-complete';

/**
 * Runs the seed steps when the database is new (or its first seeding was interrupted).
 * @param db - a migrated database
 * @param env - SEED_DEMO decides whether demo steps run
 * @param log - progress lines
 * @returns the names of the steps that ran (empty for an existing database)
 */
export async function seedIfNew(db: Db, env: Pick<Env, 'SEED_DEMO'>, log: Log): Promise<string[]> {
  const steps = registeredSeedSteps().filter((step) => env.SEED_DEMO || !step.demo);
  const names = [SEEDING_COMPLETE, ...steps.map((step) => step.name)];
  const done = new Set((await db.select().from(seedRuns).where(inArray(seedRuns.name, names))).map((row) => row.name));
  if (done.has(SEEDING_COMPLETE)) return [];
  const ran: string[] = [];
  for (const step of steps) {
    if (done.has(step.name)) continue;
    await step.run({ db, log });
    await db.insert(seedRuns).values({ name: step.name });
    ran.push(step.name);
  }
  await db.insert(seedRuns).values({ name: SEEDING_COMPLETE });
  return ran;
}
