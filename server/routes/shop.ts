/**
 * `/api/shop`: the public shop. Products and variants on sale, a quote of the cart, checkout (rate-limited per
 * client, counted in the database across processes), the customer's private order page by token, sample photos,
 * the 3D model and the spec sheet of a variant.
 */
import { Router, type Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { OrderTokenParamsSchema } from '../../shared/schemas/order';
import {
  CheckoutRequestSchema,
  ShopProductQuerySchema,
  ShopQuoteRequestSchema,
  ShopSlugParamsSchema,
  type CheckoutRequest,
  type ShopProductQuery,
  type ShopQuoteRequest,
} from '../../shared/schemas/shop';
import { SkuParamsSchema } from '../../shared/schemas/sales';
import { writeStl } from '../../shared/mesh/writeStl';
import type { AppContext } from '../context';
import { HttpError, notFound } from '../http/HttpError';
import { parsedBody, parsedParams, parsedQuery, validate } from '../http/validate';
import { DbRateLimitStore } from '../auth/DbRateLimitStore';
import { loadPaymentEnv } from '../payments/paymentEnv';
import { getVariantBySku } from '../services/catalogue';
import { quoteCart, startCheckout } from '../services/checkoutService';
import { getForCustomer } from '../services/orderQueries';
import { openPhoto } from '../services/photoService';
import { answerKey, cachedCatalogueAnswer, sendCachedAnswer } from '../services/catalogueCache';
import { getShopProduct, isShopPhoto, listShopProducts } from '../services/shopCatalogue';
import { openSpecSheet } from '../services/specSheetDocuments';
import { getStudio } from '../services/studio';
import { productMeshInWorker } from '../workers/ProductMeshWorker';
import { sendStoredFile } from '../storage/sendStoredFile';

/** The rate-limit window of checkout creation. */
export const CHECKOUT_WINDOW_MS = 10 * 60 * 1000;

const PhotoParamsSchema = z.object({ id: z.uuid('no such photo') });

/** The shop's own address as the customer reached it (PUBLIC_ORIGIN when set). */
function siteOrigin(ctx: AppContext, req: Request): string {
  return ctx.env.PUBLIC_ORIGIN?.replace(/\/$/, '') ?? `${req.protocol}://${req.get('Host') ?? 'localhost'}`;
}

/**
 * Builds the shop router (mounted at `/api/shop`; every route is public).
 * @param ctx - the application context
 */
export function shopRouter(ctx: AppContext): Router {
  const router = Router();
  // Counted in the database (`rate_limit_hits`), so the limit holds across every API process.
  const checkoutLimiter = rateLimit({
    store: new DbRateLimitStore(ctx.db, 'checkout:'),
    windowMs: CHECKOUT_WINDOW_MS,
    limit: loadPaymentEnv().CHECKOUT_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
    handler: (_req, _res, next) => {
      next(
        new HttpError(
          429,
          'too_many_checkouts',
          'Too many checkouts from here in a short time. Wait ten minutes and try again.',
        ),
      );
    },
  });

  // The studio's name for the shop's header and the locale its prices are written in (public; it changes rarely,
  // so browsers may keep it a minute).
  router.get('/studio', async (_req, res) => {
    res.set('Cache-Control', 'public, max-age=60');
    res.json(await getStudio(ctx.db));
  });

  // Product answers are cached until the catalogue or the shop settings change, with an ETag and gzip.
  router.get('/products', validate({ query: ShopProductQuerySchema }), async (req, res) => {
    const query = parsedQuery<ShopProductQuery>(res);
    const answer = await cachedCatalogueAnswer(ctx, answerKey('shop-products', query), () =>
      listShopProducts(ctx, query),
    );
    sendCachedAnswer(ctx, req, res, answer, { scope: 'public' });
  });

  router.get('/products/:slug', validate({ params: ShopSlugParamsSchema }), async (req, res) => {
    const { slug } = parsedParams<{ slug: string }>(res);
    const answer = await cachedCatalogueAnswer(ctx, answerKey('shop-product', { slug }), async () => {
      const product = await getShopProduct(ctx, slug);
      if (!product) throw notFound('No such product in the shop.');
      return product;
    });
    sendCachedAnswer(ctx, req, res, answer, { scope: 'public' });
  });

  router.post('/quote', validate({ body: ShopQuoteRequestSchema }), async (_req, res) => {
    const body = parsedBody<ShopQuoteRequest>(res);
    res.json(await quoteCart(ctx, body.items, body.country));
  });

  router.post('/checkout', checkoutLimiter, validate({ body: CheckoutRequestSchema }), async (req, res) => {
    res.status(201).json(await startCheckout(ctx, parsedBody<CheckoutRequest>(res), siteOrigin(ctx, req)));
  });

  router.get('/orders/:token', validate({ params: OrderTokenParamsSchema }), async (_req, res) => {
    res.set('Referrer-Policy', 'no-referrer');
    res.json(await getForCustomer(ctx.db, parsedParams<{ token: string }>(res).token));
  });

  for (const [path, size] of [
    ['/photos/:id', 'normal'],
    ['/photos/:id/thumb', 'thumb'],
  ] as const) {
    router.get(path, validate({ params: PhotoParamsSchema }), async (_req, res) => {
      const { id } = parsedParams<{ id: string }>(res);
      if (!(await isShopPhoto(ctx, id))) throw notFound('No such photo in the shop.');
      await sendStoredFile(res, await openPhoto(ctx, id, size), {
        'Content-Type': 'image/webp',
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'public, max-age=3600',
      });
    });
  }

  router.get('/variants/:sku/model.stl', validate({ params: SkuParamsSchema }), async (_req, res) => {
    const variant = await getVariantBySku(ctx, parsedParams<{ sku: string }>(res).sku);
    if (!variant) throw notFound('No such product in the shop.');
    const product = await productMeshInWorker(variant.templateId, variant.params);
    res.set({ 'Content-Type': 'model/stl', 'Cache-Control': 'public, max-age=86400' });
    res.send(Buffer.from(writeStl(product.mesh)));
  });

  router.get('/variants/:sku/spec-sheet.pdf', validate({ params: SkuParamsSchema }), async (_req, res) => {
    const { sku } = parsedParams<{ sku: string }>(res);
    const variant = await getVariantBySku(ctx, sku);
    if (!variant) throw notFound('No such product in the shop.');
    await sendStoredFile(res, await openSpecSheet(ctx, [variant]), {}, `spec-sheet-${sku}.pdf`);
  });

  return router;
}
