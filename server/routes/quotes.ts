/** Wholesale quotes: `POST /api/quotes`, `GET /api/quotes`, `GET /api/quotes/:id`, `GET /api/quotes/:id.pdf`. */
import { Router } from 'express';
import { QuoteCreateSchema, QuoteIdParamsSchema, type QuoteCreate } from '../../shared/schemas/quote';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { badRequest, notFound } from '../http/HttpError';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { renderQuotePdf } from '../pdf/quotePdf';
import { sendAttachment } from '../pdf/sendAttachment';
import { getVariantBySku } from '../services/catalogue';
import { computeQuote, findQuote, insertQuote, listQuotes } from '../services/quote';
import { getSalesSettings } from '../services/salesSettings';
import { STUDIO_NAME } from '../services/specSheet';

/**
 * Builds the quotes router (mounted at `/api/quotes`); sales and catalogue managers only.
 * @param ctx - the application context
 */
export function quotesRouter(ctx: AppContext): Router {
  const router = Router();
  const sellers = requireRole('sales', 'catalogue_manager');

  router.get('/', sellers, async (_req, res) => {
    res.json({ quotes: await listQuotes(ctx.db) });
  });

  router.post('/', sellers, validate({ body: QuoteCreateSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const body = parsedBody<QuoteCreate>(res);
    const variant = await getVariantBySku(ctx, body.sku);
    if (!variant)
      throw badRequest(`There is no published product with the SKU ${body.sku}.`, [
        { in: 'body', path: 'sku', message: 'This SKU is not in the catalogue.' },
      ]);
    const { settings } = await getSalesSettings(ctx.db);
    const quote = await insertQuote(ctx.db, computeQuote(variant, body, settings, new Date()), person);
    res.status(201).json(quote);
  });

  // Before `/:id`, so `<id>.pdf` is not read as an id.
  router.get('/:id.pdf', sellers, validate({ params: QuoteIdParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<{ id: string }>(res);
    const quote = await findQuote(ctx.db, id);
    if (!quote) throw notFound('No such quote.');
    sendAttachment(res, await renderQuotePdf(quote, STUDIO_NAME), 'application/pdf', `quote-${quote.reference}.pdf`);
  });

  router.get('/:id', sellers, validate({ params: QuoteIdParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<{ id: string }>(res);
    const quote = await findQuote(ctx.db, id);
    if (!quote) throw notFound('No such quote.');
    res.json(quote);
  });

  return router;
}
