/** Spec sheets as PDF: `GET /api/variants/:sku/spec-sheet.pdf` and `GET /api/families/:id/spec-sheet.pdf`. */
import { Router } from 'express';
import { FamilyIdParamsSchema, SkuParamsSchema } from '../../shared/schemas/sales';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { badRequest, notFound } from '../http/HttpError';
import { parsedParams, validate } from '../http/validate';
import { getVariantBySku, listCatalogueVariants } from '../services/catalogue';
import { openSpecSheet } from '../services/specSheetDocuments';
import { sendStoredFile } from '../storage/sendStoredFile';

/** Most variants one family spec sheet covers (two pages and about a second of geometry each). */
export const FAMILY_SHEET_MAX_VARIANTS = 60;

/**
 * Builds the spec-sheet router (mounted at `/api`; each route checks its roles). Sheets are generated documents kept
 * in the file store and streamed from it.
 * @param ctx - the application context
 */
export function specSheetsRouter(ctx: AppContext): Router {
  const router = Router();
  const sellers = requireRole('sales', 'catalogue_manager');

  router.get('/variants/:sku/spec-sheet.pdf', sellers, validate({ params: SkuParamsSchema }), async (_req, res) => {
    const { sku } = parsedParams<{ sku: string }>(res);
    const variant = await getVariantBySku(ctx, sku);
    if (!variant) throw notFound(`No published variant ${sku}.`);
    await sendStoredFile(res, await openSpecSheet(ctx, [variant]), {}, `spec-sheet-${sku}.pdf`);
  });

  router.get('/families/:id/spec-sheet.pdf', sellers, validate({ params: FamilyIdParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<{ id: string }>(res);
    const variants = await listCatalogueVariants(ctx, { familyId: id });
    if (variants.length === 0) throw notFound('No published family with that id.');
    if (variants.length > FAMILY_SHEET_MAX_VARIANTS)
      throw badRequest(
        `id: the family has ${variants.length} published variants; one document covers at most ${FAMILY_SHEET_MAX_VARIANTS}: download the variants' sheets one by one`,
      );
    await sendStoredFile(res, await openSpecSheet(ctx, variants), {}, `spec-sheets-${variants[0].family.code}.pdf`);
  });

  return router;
}
