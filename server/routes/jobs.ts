/** `/api/jobs`: background jobs that failed their last attempt (admin only), whichever queue back end ran them. */
import { desc } from 'drizzle-orm';
import { Router } from 'express';
import type { DeadLettersResponse } from '../../shared/schemas/jobs';
import { requireRole } from '../auth/requireRole';
import type { AppContext } from '../context';
import { jobDeadLetters } from '../db/schema';

/**
 * Builds the jobs router (mounted at `/api/jobs`).
 * @param ctx - the application context
 */
export function jobsRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/dead-letters', requireRole('admin'), async (_req, res) => {
    const rows = await ctx.db.select().from(jobDeadLetters).orderBy(desc(jobDeadLetters.id)).limit(200);
    const body: DeadLettersResponse = {
      deadLetters: rows.map((row) => ({ ...row, failedAt: row.failedAt.toISOString() })),
    };
    res.json(body);
  });
  return router;
}
