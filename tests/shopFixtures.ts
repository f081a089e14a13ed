/** Shop test helpers: a test app with the local payment fake listening and delivering webhooks to it. */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type Stripe from 'stripe';
import { PaymentEnvSchema } from '../server/payments/paymentEnv';
import { startPayments, stopPayments, type PaymentRuntime } from '../server/payments/paymentRuntime';
import { startCheckout } from '../server/services/checkoutService';
import { getShopProduct, listShopProducts } from '../server/services/shopCatalogue';
import { markPaid } from '../server/services/orderService';
import { getRow } from '../server/services/orderQueries';
import type { CheckoutRequest } from '../shared/schemas/shop';
import type { TestApp } from './setup/testApp';

/** A published SKU of the seeded demo family (Hedgerow Gable). */
export const SHOP_SKU = 'FH-HGB-28-SHIN-MOSS';
/** A second published SKU of the same family. */
export const SHOP_SKU_2 = 'FH-HGB-32-SHIN-MOSS';

/**
 * Two SKUs on sale right now (other tests may retire the seeded family, so look them up).
 * @param t - the test app
 */
export async function sellableSkus(t: TestApp): Promise<[string, string]> {
  const { products } = await listShopProducts(t.ctx);
  if (products.length === 0) throw new Error('Nothing is on sale in this test database');
  const product = await getShopProduct(t.ctx, products[0].slug);
  const variants = product!.variants;
  return [variants[0].sku, variants[Math.min(1, variants.length - 1)].sku];
}

/**
 * A valid checkout body.
 * @param email - the customer's e-mail
 * @param skus - the two SKUs to buy (the seeded family's by default)
 */
export function checkoutBody(
  email = 'wren@example.test',
  skus: readonly string[] = [SHOP_SKU, SHOP_SKU_2],
): CheckoutRequest {
  return {
    email,
    shipTo: {
      name: 'Wren Fieldfare',
      line1: '4 Orchard Row',
      line2: '',
      city: 'Ashby',
      region: '',
      postalCode: 'AB1 2CD',
      country: 'GB',
    },
    items: [
      { sku: skus[0], quantity: 2 },
      { sku: skus[1], quantity: 1 },
    ],
  };
}

/** The shop parts of a test: the payment runtime and the HTTP server the fake delivers to. */
export interface ShopTest {
  payments: PaymentRuntime;
  server: Server;
  /** Stops the fake and the server. */
  close(): Promise<void>;
}

/**
 * Starts the payment fake for a test app and serves the app on a free port so webhooks reach it.
 * @param t - the test app
 */
export async function startShopTest(t: TestApp): Promise<ShopTest> {
  const server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  const payments = await startPayments(t.ctx, {
    env: PaymentEnvSchema.parse({}),
    webhookUrl: `http://127.0.0.1:${port}/api/webhooks/payments`,
    fakeRetry: { retryBaseMs: 50, retryMaxMs: 200, maxAttempts: 3 },
  });
  return {
    payments,
    server,
    async close() {
      await stopPayments(t.ctx);
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/**
 * A new order through the checkout service (not the rate-limited route), optionally paid.
 * @param t - the test app
 * @param paid - mark it paid with the exact total
 */
export async function newShopOrder(t: TestApp, paid: boolean | 'short' = false): Promise<string> {
  const { orderId } = await startCheckout(
    t.ctx,
    checkoutBody(undefined, await sellableSkus(t)),
    'http://nestwright.test',
  );
  if (paid) {
    const row = await getRow(t.ctx.db, orderId);
    await markPaid(t.ctx.db, orderId, {
      paymentIntentId: null,
      // 'short': one cent less than the total, so the payment is flagged.
      amountMinor: paid === 'short' ? row.totalMinor - 1 : row.totalMinor,
      currency: row.currency,
      eventId: `evt_test_${orderId}`,
    });
  }
  return orderId;
}

/**
 * A provider event as the fake would send it, for a session, with fields overridden.
 * @param session - the session object
 * @param type - event type
 */
export function sessionEvent(session: object, type = 'checkout.session.completed'): Stripe.Event {
  return {
    id: `evt_test_${Math.random().toString(36).slice(2)}`,
    object: 'event',
    api_version: '2026-10-28.endive',
    created: Math.floor(Date.now() / 1000),
    data: { object: session },
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type,
  } as unknown as Stripe.Event;
}
