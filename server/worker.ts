/**
 * `npm run worker`: a background-job process with no HTTP server, for PostgreSQL deployments. It runs family
 * variant jobs, mail delivery and every job in the registry; start as many as you like, on any machine with the
 * same DATABASE_URL (and S3_ settings when files are in object storage). Stops cleanly on SIGINT/SIGTERM: it takes
 * no new jobs, and a job cut off is retried by another worker after its time limit.
 */
import { createContext, type AppContext } from './context';
import { migrateDatabase, openConfiguredDatabase, withStartupLock } from './db/client';
import { loadEnv } from './env';
import { openJobQueue } from './jobs/openJobQueue';
import { startBackgroundWork, stopBackgroundWork } from './services/familyServices';

const env = loadEnv();
if (!env.DATABASE_URL) {
  console.error(
    'npm run worker needs DATABASE_URL (a PostgreSQL server). With the built-in database, npm start runs the jobs itself.',
  );
  process.exit(2);
}
const started = performance.now();
const { pg, db, url } = await openConfiguredDatabase(env, undefined, 'nestwright worker');
await withStartupLock(url, () => migrateDatabase(db));
const ctx: AppContext = createContext({ db, pg, env, jobs: openJobQueue(env, () => ctx, 'nestwright worker') });
await ctx.jobs.start();
await startBackgroundWork(ctx);
console.log(`Nestwright worker ${process.pid} is taking jobs (${Math.round(performance.now() - started)} ms)`);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: worker ${process.pid} stopping...`);
    stopBackgroundWork(ctx)
      .then(() => pg.close())
      .then(
        () => process.exit(0),
        (err: unknown) => {
          console.error(err);
          process.exit(1);
        },
      );
  });
}
