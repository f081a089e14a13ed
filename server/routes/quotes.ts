/**
 * Wholesale quotes: `GET|POST /api/quotes`, `GET|PUT /api/quotes/:id`, `POST /api/quotes/:id/copy`,
 * `POST /api/quotes/:id/status`, `GET /api/quotes/:id.pdf`.
 */
import { Router } from 'express';
import { isQuoteEditable, quoteTransitionRefusal } from '../../shared/quotes/quoteStatus';
import {
  QuoteIdParamsSchema,
  QuoteInputSchema,
  QuoteStatusChangeSchema,
  todayUtc,
  type Quote,
  type QuoteInput,
  type QuoteStatusChange,
} from '../../shared/schemas/quote';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { conflict, notFound } from '../http/HttpError';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { renderQuotePdf } from '../pdf/quotePdf';
import { sendAttachment } from '../pdf/sendAttachment';
import { listCatalogueVariants } from '../services/catalogue';
import { loadPrinters } from '../services/familyProduction';
import { computeQuote, type QuoteFigures } from '../services/quote';
import { findQuote, insertQuote, listQuotes, replaceQuote, setQuoteStatus } from '../services/quoteRecords';
import { getSalesSettings } from '../services/salesSettings';
import { getStudio } from '../services/studio';

/**
 * Builds the quotes router (mounted at `/api/quotes`); sales and catalogue managers only.
 * @param ctx - the application context
 */
export function quotesRouter(ctx: AppContext): Router {
  const router = Router();
  const sellers = requireRole('sales', 'catalogue_manager');
  const idParams = validate({ params: QuoteIdParamsSchema });

  /** Prices a checked body against today's catalogue and settings. */
  async function price(body: QuoteInput): Promise<QuoteFigures> {
    const skus = [...new Set(body.lines.map((line) => line.sku))];
    const variants = new Map<string, CatalogueVariant>(
      (await listCatalogueVariants(ctx, { skus })).map((v) => [v.sku, v]),
    );
    const [{ settings }, printers] = await Promise.all([getSalesSettings(ctx.db), loadPrinters(ctx.db)]);
    return computeQuote(variants, body, settings, new Date(), printers);
  }

  async function existing(id: string): Promise<Quote> {
    const quote = await findQuote(ctx.db, id);
    if (!quote) throw notFound('No such quote.');
    return quote;
  }

  router.get('/', sellers, async (_req, res) => {
    res.json({ quotes: await listQuotes(ctx.db) });
  });

  router.post('/', sellers, validate({ body: QuoteInputSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const figures = await price(parsedBody<QuoteInput>(res));
    res.status(201).json(await insertQuote(ctx.db, figures, person));
  });

  // Before `/:id`, so `<id>.pdf` is not read as an id.
  router.get('/:id.pdf', sellers, idParams, async (_req, res) => {
    const quote = await existing(parsedParams<{ id: string }>(res).id);
    const studio = await getStudio(ctx.db);
    sendAttachment(
      res,
      await renderQuotePdf(quote, studio.name, studio.locale),
      'application/pdf',
      `quote-${quote.reference}.pdf`,
    );
  });

  router.get('/:id', sellers, idParams, async (_req, res) => {
    res.json(await existing(parsedParams<{ id: string }>(res).id));
  });

  router.put('/:id', sellers, validate({ params: QuoteIdParamsSchema, body: QuoteInputSchema }), async (_req, res) => {
    const quote = await existing(parsedParams<{ id: string }>(res).id);
    if (!isQuoteEditable(quote.status))
      throw conflict(
        'quote_not_editable',
        quote.status === 'accepted'
          ? 'This quote has been accepted and can no longer be changed. Copy it to make a new one.'
          : 'This quote has expired and can no longer be changed. Copy it to make a new one with new dates.',
      );
    const figures = await price(parsedBody<QuoteInput>(res));
    res.json(await replaceQuote(ctx.db, quote.id, figures));
  });

  router.post('/:id/copy', sellers, idParams, async (_req, res) => {
    const person = signedInPerson(res);
    const source = await existing(parsedParams<{ id: string }>(res).id);
    const today = todayUtc();
    const moveDate = source.deliveryDate < today;
    const figures = await price({
      customerName: source.customerName,
      deliveryDate: moveDate ? today : source.deliveryDate,
      // A copy is a new offer: it gets a new validity period.
      validUntil: undefined,
      terms: source.terms,
      taxRatePct: source.taxRatePct,
      shippingCents: source.shippingCents,
      // Prices agreed by hand are kept; the others follow today's catalogue and breaks.
      lines: source.lines.map((line) => ({
        sku: line.sku,
        quantity: line.quantity,
        unitPriceCents: line.priceSetByHand ? line.unitPriceCents : null,
      })),
    }).catch((err: unknown) => {
      if (err instanceof Error && 'status' in err && err.status === 400)
        throw conflict('quote_not_copyable', `${err.message} Make a new quote with the products on sale today.`);
      throw err;
    });
    // A delivery date that has passed moves to the earliest date the farm can make.
    const dated = moveDate ? { ...figures, deliveryDate: figures.earliestDeliveryDate, feasible: true } : figures;
    res.status(201).json(await insertQuote(ctx.db, dated, person, source.id));
  });

  router.post(
    '/:id/status',
    sellers,
    validate({ params: QuoteIdParamsSchema, body: QuoteStatusChangeSchema }),
    async (_req, res) => {
      const quote = await existing(parsedParams<{ id: string }>(res).id);
      const { status } = parsedBody<QuoteStatusChange>(res);
      const refusal = quoteTransitionRefusal(quote.status, status);
      if (refusal) throw conflict('quote_status', refusal);
      res.json(await setQuoteStatus(ctx.db, quote.id, status));
    },
  );

  return router;
}
