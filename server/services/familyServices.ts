/** Starts and stops what the family features run beside the HTTP server: e-mail and the computation worker. */
import type { Server } from 'node:http';
import type { AppContext } from '../context';
import { familyJobs } from '../jobs/FamilyJobRunner';
import { startMail, stopMail, type StartMailOptions } from './mailService';

/**
 * Starts the fake SMTP server (or a sender to SMTP_HOST) and arranges for mail and background computations to stop
 * when the HTTP server closes. boot() calls this once after the server listens.
 * @param ctx - the app context
 * @param server - the HTTP server whose close stops them
 * @param options - mail settings (process.env by default)
 */
export async function startFamilyServices(ctx: AppContext, server: Server, options: StartMailOptions = {}): Promise<void> {
  const mail = await startMail(ctx, options);
  ctx.log(`  mail: ${mail.smtp ? `fake SMTP server on port ${mail.port}` : `delivering to port ${mail.port}`}`);
  server.once('close', () => {
    void familyJobs(ctx).close();
    void stopMail(ctx);
  });
}
