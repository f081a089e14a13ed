/** Starts and stops what the family features run beside the HTTP server: e-mail and the computation worker. */
import type { Server } from 'node:http';
import { inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import { familyRevisions } from '../db/schema';
import { familyJobs } from '../jobs/FamilyJobRunner';
import { BACKGROUND_JOBS } from '../jobs/jobRegistry';
import { startMail, stopMail, type StartMailOptions } from './mailService';

/**
 * Starts the fake SMTP server (or a sender to SMTP_HOST) and arranges for mail and background computations to stop
 * when the HTTP server closes. boot() calls this once after the server listens.
 * @param ctx - the app context
 * @param server - the HTTP server whose close stops them
 * @param options - mail settings (process.env by default)
 */
export async function startFamilyServices(
  ctx: AppContext,
  server: Server,
  options: StartMailOptions = {},
): Promise<void> {
  // A computation cut off by a restart cannot resume: say so instead of showing it running forever.
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
  await ctx.jobs.work(BACKGROUND_JOBS);
  const mail = await startMail(ctx, options);
  ctx.log(`  mail: ${mail.smtp ? `fake SMTP server on port ${mail.port}` : `delivering to port ${mail.port}`}`);
  server.once('close', () => {
    void familyJobs(ctx).close();
    void stopMail(ctx);
    void ctx.jobs.stop();
  });
}
