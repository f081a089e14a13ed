/** Builds the Express app (no listening): the API under /api and, when built, the client with an SPA fallback. */
import compression from 'compression';
import express, { type Express, type RequestHandler } from 'express';
import { sessionMiddleware } from './auth/sessionMiddleware';
import type { AppContext } from './context';
import { errorHandler } from './http/errorHandler';
import { notFound } from './http/HttpError';
import { originCheck } from './http/originCheck';
import { securityHeaders } from './http/securityHeaders';
import { serveClient } from './http/serveClient';
import { authRouter } from './routes/auth';
import { healthRouter } from './routes/health';
import { peopleRouter } from './routes/people';
import { homeRouter } from './routes/home';
import { presetsRouter } from './routes/presets';
import { familiesRouter } from './routes/families';
import { catalogueRouter } from './routes/catalogue';
import { photosRouter } from './routes/photos';
import { mailRouter } from './routes/mail';
import { jobsRouter } from './routes/jobs';
import { analysesRouter } from './routes/analyses';
import { exportsRouter } from './routes/exports';
import { templatesRouter } from './routes/templates';
import { specSheetsRouter } from './routes/specSheets';
import { priceListRouter } from './routes/priceList';
import { quotesRouter } from './routes/quotes';
import { settingsRouter } from './routes/settings';
import { productionRouter } from './routes/production';
import { farmRouter } from './routes/farm';
import { farmNoticesRouter } from './routes/farmNotices';
import { shopRouter } from './routes/shop';
import { ordersRouter } from './routes/orders';
import { paymentWebhooksRouter } from './routes/paymentWebhooks';
import { repeatSentAnswers } from './services/catalogueCache';

/** Largest JSON body the API accepts. */
export const JSON_BODY_LIMIT = '1mb';

/** Options of {@link createApp}. */
export interface CreateAppOptions {
  /** Folder of the built client (dist/client) to serve with an SPA fallback; omitted in tests and in dev. */
  clientDir?: string;
}

/**
 * Builds the app for a context. Routers are factories `xRouter(ctx)` mounted under /api here.
 * @param ctx - app context
 * @param options - what else to serve
 */
export function createApp(ctx: AppContext, options: CreateAppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  if (ctx.env.TRUST_PROXY) app.set('trust proxy', parseTrustProxy(ctx.env.TRUST_PROXY));
  // A catalogue or shop answer already sent, asked again (same URL and Accept-Encoding, cache still current, a
  // remembered session with the right role): sent again as it was, before the rest of the chain.
  app.use(repeatSentAnswers(ctx));
  // gzip/brotli for JSON, pages and scripts over 1 KB; event streams stay unbuffered; cached answers come pre-encoded.
  app.use(compression({ filter: compressible }));
  // Security headers (CSP, nosniff, no framing, referrer policy) on every answer: pages, files and API.
  app.use(securityHeaders({ publicOrigin: ctx.env.PUBLIC_ORIGIN }));

  // Farm notices are checked over their raw bytes: mounted before the JSON parser (public: the signature is the check).
  app.use('/api/webhooks/farm', farmNoticesRouter(ctx));
  // The payment provider's webhooks need the raw body and come from no browser: before the JSON parser and origin check.
  app.use('/api/webhooks/payments', paymentWebhooksRouter(ctx));

  // Every /api request: JSON body (1 MB), no caching, origin check on state-changing methods, session.
  app.use(
    '/api',
    express.json({ limit: JSON_BODY_LIMIT }),
    noStore,
    originCheck(ctx.env.PUBLIC_ORIGIN),
    sessionMiddleware(ctx),
  );

  // API routers: one line per router; add yours here (and its rows to tests/authz.test.ts).
  app.use('/api/health', healthRouter());
  app.use('/api/auth', authRouter(ctx));
  app.use('/api/people', peopleRouter(ctx));
  app.use('/api/home', homeRouter(ctx));
  app.use('/api/presets', presetsRouter(ctx));
  app.use('/api/families', familiesRouter(ctx));
  app.use('/api/catalogue', catalogueRouter(ctx));
  app.use('/api/photos', photosRouter(ctx));
  app.use('/api/mail', mailRouter(ctx));
  app.use('/api/jobs', jobsRouter(ctx));
  app.use('/api/analyses', analysesRouter(ctx));
  app.use('/api/templates', templatesRouter());
  app.use('/api/exports', exportsRouter(ctx));

  app.use('/api', specSheetsRouter(ctx));
  app.use('/api', priceListRouter(ctx));
  app.use('/api/quotes', quotesRouter(ctx));
  app.use('/api/settings', settingsRouter(ctx));
  app.use('/api/production', productionRouter(ctx));
  app.use('/api/farm', farmRouter(ctx));
  app.use('/api/shop', shopRouter(ctx));
  app.use('/api/orders', ordersRouter(ctx));

  // Anything else under /api is a 404 in the error shape (keep this after every API router).
  app.use('/api', (req) => {
    throw notFound(`No API route ${req.method} ${req.originalUrl.split('?')[0]}.`);
  });

  if (options.clientDir) app.use(serveClient(options.clientDir));

  app.use(
    errorHandler((err) =>
      ctx.log(`Unexpected error: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`),
    ),
  );
  return app;
}

/** API answers are per person and change often: never cache them. */
const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};

/** Compression's own test, except for server-sent events (compressing would hold events back in the buffer). */
const compressible: compression.CompressionFilter = (req, res) =>
  !String(res.getHeader('Content-Type') ?? '').startsWith('text/event-stream') && compression.filter(req, res);

/** TRUST_PROXY as Express wants it: a hop count, true/false, or an address list. */
function parseTrustProxy(value: string): boolean | number | string {
  if (value === 'true') return true;
  if (value === 'false') return false;
  return /^\d+$/.test(value) ? Number(value) : value;
}
