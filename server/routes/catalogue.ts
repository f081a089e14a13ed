/**
 * `/api/catalogue`: published variants for sales, catalogue managers and designers. Answers are cached until the
 * catalogue changes, with an ETag (If-None-Match gets 304) and gzip.
 */
import { Router } from 'express';
import { CatalogueQuerySchema, type CatalogueQuery } from '../../shared/schemas/catalogue';
import type { Role } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { parsedQuery, validate } from '../http/validate';
import { listCatalogueVariants } from '../services/catalogue';
import { answerKey, cachedCatalogueAnswer, sendCachedAnswer } from '../services/catalogueCache';

/** Roles that read the catalogue. */
const CATALOGUE_READERS = ['sales', 'catalogue_manager', 'designer'] as const satisfies readonly Role[];

/**
 * Builds the catalogue router (mounted at `/api/catalogue`).
 * @param ctx - the application context
 */
export function catalogueRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', requireRole(...CATALOGUE_READERS), validate({ query: CatalogueQuerySchema }), async (req, res) => {
    const query = parsedQuery<CatalogueQuery>(res);
    const answer = await cachedCatalogueAnswer(ctx, answerKey('catalogue', query), async () => ({
      variants: await listCatalogueVariants(ctx, query),
    }));
    sendCachedAnswer(ctx, req, res, answer, { scope: 'private', roles: CATALOGUE_READERS });
  });
  return router;
}
