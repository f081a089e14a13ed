/**
 * `/api/jobs` (admin only): background jobs that failed their last attempt, whichever queue back end ran them;
 * send one again or discard it.
 */
import { Router } from 'express';
import { DeadLetterParamsSchema, DeadLettersQuerySchema, type DeadLettersQuery } from '../../shared/schemas/jobs';
import { requireRole, signedInPerson } from '../auth/requireRole';
import type { AppContext } from '../context';
import { parsedParams, parsedQuery, validate } from '../http/validate';
import { discardDeadLetter, listDeadLetters, retryDeadLetter } from '../services/deadLetterService';

/**
 * Builds the jobs router (mounted at `/api/jobs`).
 * @param ctx - the application context
 */
export function jobsRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireRole('admin'));
  const idParams = validate({ params: DeadLetterParamsSchema });

  router.get('/dead-letters', validate({ query: DeadLettersQuerySchema }), async (_req, res) => {
    res.json(await listDeadLetters(ctx, parsedQuery<DeadLettersQuery>(res)));
  });

  router.post('/dead-letters/:id/retry', idParams, async (_req, res) => {
    res.json(await retryDeadLetter(ctx, parsedParams<{ id: number }>(res).id, signedInPerson(res).id));
  });

  router.post('/dead-letters/:id/discard', idParams, async (_req, res) => {
    res.json(await discardDeadLetter(ctx, parsedParams<{ id: number }>(res).id, signedInPerson(res).id));
  });
  return router;
}
