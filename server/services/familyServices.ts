/**
 * Starts and stops what runs beside the HTTP server: background jobs (family computation, mail delivery and the
 * jobs in the registry) unless worker processes run them, and the family progress relay.
 */
import type { Server } from 'node:http';
import { inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import { familyRevisions } from '../db/schema';
import { closeVariantWorker } from '../jobs/computeVariantJob';
import { familyJobs } from '../jobs/FamilyJobRunner';
import { BACKGROUND_JOBS } from '../jobs/jobRegistry';
import { startMail, stopMail, type StartMailOptions } from './mailService';

/**
 * Makes this process run background jobs: works every registered job type and delivers mail (the fake SMTP server
 * or a sender to SMTP_HOST). An API process does it when JOBS_IN_API is true (the default); `npm run worker` always.
 * @param ctx - the app context
 * @param options - mail settings (process.env by default)
 */
export async function startBackgroundWork(ctx: AppContext, options: StartMailOptions = {}): Promise<void> {
  await ctx.jobs.work(BACKGROUND_JOBS);
  const mail = await startMail(ctx, options);
  ctx.log(`  mail: ${mail.smtp ? `fake SMTP server on port ${mail.port}` : `delivering to port ${mail.port}`}`);
}

/**
 * Stops background work in this process: mail, family computation, the job queue.
 * @param ctx - the app context
 */
export async function stopBackgroundWork(ctx: AppContext): Promise<void> {
  await familyJobs(ctx).close();
  await stopMail(ctx);
  await ctx.jobs.stop();
  await closeVariantWorker(ctx);
}

/**
 * Starts background work in the API process (unless workers run it) and arranges for it to stop when the HTTP
 * server closes. boot() calls this once after the server listens.
 * @param ctx - the app context
 * @param server - the HTTP server whose close stops them
 * @param options - mail settings (process.env by default)
 */
export async function startFamilyServices(
  ctx: AppContext,
  server: Server,
  options: StartMailOptions = {},
): Promise<void> {
  if (ctx.jobs.kind === 'in-process') {
    // A computation cut off by a restart cannot resume in one process: say so instead of showing it running forever.
    // (On PostgreSQL the variant jobs wait in the queue and resume.)
    const interrupted = await ctx.db
      .update(familyRevisions)
      .set({
        computeState: 'failed',
        computeError: 'the server restarted during the computation; compute again',
        computeFinishedAt: new Date(),
      })
      .where(inArray(familyRevisions.computeState, ['queued', 'running']))
      .returning({ id: familyRevisions.id });
    if (interrupted.length > 0) ctx.log(`  families: ${interrupted.length} interrupted computation(s) marked failed`);
  }
  if (ctx.jobs.kind === 'in-process' || ctx.env.JOBS_IN_API) await startBackgroundWork(ctx, options);
  else ctx.log('  background jobs: left to worker processes (JOBS_IN_API=false)');
  server.once('close', () => void stopBackgroundWork(ctx));
}
