/** The home page's data: `GET /api/home/todo`. */
import { Router } from 'express';
import type { TodoResponse } from '../../shared/schemas/todo';
import { requireAuth, signedInPerson } from '../auth/requireRole';
import type { AppContext } from '../context';
import { todoCounts } from '../services/todoCounts';
import { isoDay } from '../../shared/format';

/**
 * `/api/home` (any signed-in person): `GET /todo` -> `{ items }`, the to-do counts of the roles they hold.
 * @param ctx - app context
 */
export function homeRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/todo', requireAuth, async (_req, res) => {
    const today = isoDay();
    const body: TodoResponse = { items: await todoCounts(ctx.db, signedInPerson(res), today) };
    res.json(body);
  });
  return router;
}
