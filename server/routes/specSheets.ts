/** Spec sheets as PDF: `GET /api/variants/:sku/spec-sheet.pdf` and `GET /api/families/:id/spec-sheet.pdf`. */
import { Router } from 'express';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import { FamilyIdParamsSchema, SkuParamsSchema } from '../../shared/schemas/sales';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { badRequest, HttpError, notFound } from '../http/HttpError';
import { parsedParams, validate } from '../http/validate';
import { sendAttachment } from '../pdf/sendAttachment';
import { getVariantBySku, listCatalogueVariants } from '../services/catalogue';
import { readPhoto } from '../services/photoService';
import { getSalesSettings } from '../services/salesSettings';
import { renderSpecSheets } from '../services/specSheet';

/** Most variants one family spec sheet covers (two pages and about a second of geometry each). */
export const FAMILY_SHEET_MAX_VARIANTS = 60;

/**
 * Builds the spec-sheet router (mounted at `/api`; each route checks its roles).
 * @param ctx - the application context
 */
export function specSheetsRouter(ctx: AppContext): Router {
  const router = Router();
  const sellers = requireRole('sales', 'catalogue_manager');

  router.get('/variants/:sku/spec-sheet.pdf', sellers, validate({ params: SkuParamsSchema }), async (_req, res) => {
    const { sku } = parsedParams<{ sku: string }>(res);
    const variant = await getVariantBySku(ctx, sku);
    if (!variant) throw notFound(`No published variant ${sku}.`);
    const { settings } = await getSalesSettings(ctx.db);
    const pdf = await renderSpecSheets([variant], { settings, photo: await samplePhoto(ctx, variant) });
    sendAttachment(res, pdf, 'application/pdf', `spec-sheet-${sku}.pdf`);
  });

  router.get('/families/:id/spec-sheet.pdf', sellers, validate({ params: FamilyIdParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<{ id: string }>(res);
    const variants = await listCatalogueVariants(ctx, { familyId: id });
    if (variants.length === 0) throw notFound('No published family with that id.');
    if (variants.length > FAMILY_SHEET_MAX_VARIANTS)
      throw badRequest(
        `id: the family has ${variants.length} published variants; one document covers at most ${FAMILY_SHEET_MAX_VARIANTS}: download the variants' sheets one by one`,
      );
    const { settings } = await getSalesSettings(ctx.db);
    const photo = await samplePhoto(ctx, variants[0]);
    const pdf = await renderSpecSheets(variants, { settings, photo });
    sendAttachment(res, pdf, 'application/pdf', `spec-sheets-${variants[0].family.code}.pdf`);
  });

  return router;
}

/** The family's first sample-print photo, or undefined (then the sheet shows a rendered view). */
async function samplePhoto(ctx: AppContext, variant: CatalogueVariant): Promise<Buffer | undefined> {
  const photo = variant.photos[0];
  if (!photo) return undefined;
  try {
    return await readPhoto(ctx, photo.id, 'normal');
  } catch (err) {
    // A photo row whose file is gone: the sheet falls back to the rendered view rather than failing.
    if (err instanceof HttpError && err.status === 404) return undefined;
    throw err;
  }
}
