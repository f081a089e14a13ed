/** `/api/catalogue`: published variants for sales, catalogue managers and designers. */
import { Router } from 'express';
import { CatalogueQuerySchema, type CatalogueQuery } from '../../shared/schemas/catalogue';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { parsedQuery, validate } from '../http/validate';
import { listCatalogueVariants } from '../services/catalogue';

/**
 * Builds the catalogue router (mounted at `/api/catalogue`).
 * @param ctx - the application context
 */
export function catalogueRouter(ctx: AppContext): Router {
  const router = Router();
  router.get(
    '/',
    requireRole('sales', 'catalogue_manager', 'designer'),
    validate({ query: CatalogueQuerySchema }),
    async (_req, res) => {
      res.json({ variants: await listCatalogueVariants(ctx, parsedQuery<CatalogueQuery>(res)) });
    },
  );
  return router;
}
