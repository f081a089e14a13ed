/** Chooses the job-queue back end: pg-boss on PostgreSQL (DATABASE_URL), the in-process queue on PGlite. */
import type { AppContext } from '../context';
import type { Env } from '../env';
import { InProcessJobQueue } from './InProcessJobQueue';
import { PgBossJobQueue } from './PgBossJobQueue';

/**
 * The job queue for an environment. pg-boss needs `start()` before use (boot and the worker call it).
 * @param env - DATABASE_URL and the job settings
 * @param ctx - the app context handlers receive (read when a job runs)
 * @param applicationName - this process in `pg_stat_activity`
 */
export function openJobQueue(
  env: Pick<Env, 'DATABASE_URL' | 'JOB_POLL_SEC' | 'JOB_MAINTENANCE_SEC'>,
  ctx: () => AppContext,
  applicationName: string,
): InProcessJobQueue | PgBossJobQueue {
  if (!env.DATABASE_URL) return new InProcessJobQueue(ctx);
  return new PgBossJobQueue(ctx, {
    url: env.DATABASE_URL,
    pollSec: env.JOB_POLL_SEC,
    maintenanceSec: env.JOB_MAINTENANCE_SEC,
    applicationName: `${applicationName} jobs`,
  });
}
