/** `/api/production`: printers, materials, print settings and cost rates, for the design editor (any signed-in person). */
import { Router } from 'express';
import type { AppContext } from '../context';
import { requireAuth } from '../auth/requireRole';
import { loadProductionCatalogue } from '../services/productionCatalogue';

/**
 * Builds the production router (mounted at `/api/production`).
 * @param ctx - the application context
 */
export function productionRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', requireAuth, async (_req, res) => {
    res.json(await loadProductionCatalogue(ctx.db));
  });
  return router;
}
