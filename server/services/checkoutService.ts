/**
 * Checkout through the payment provider's SDK: price the cart on the server, open a checkout session, store the
 * order; apply the provider's signed events once each; cancel unpaid orders and refund paid ones; expire abandoned
 * checkouts. The browser never sends a price that is used, and never sees a secret.
 */
import { randomBytes } from 'node:crypto';
import { newId } from '../db/newId';
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { formatOrderNumber } from '../../shared/schemas/order';
import type { CheckoutRequest, CheckoutResponse, ShopQuote } from '../../shared/schemas/shop';
import { CartPricingError, priceCart, type CartLine } from '../../shared/shop/priceCart';
import type { AppContext } from '../context';
import { orders, paymentEvents } from '../db/schema';
import { badRequest, conflict, HttpError, fieldProblem } from '../http/HttpError';
import { kickMail } from './mailService';
import { paymentsOf } from '../payments/paymentRuntime';
import { createFromCheckout, markPaid } from './orderService';
import { expiredUnpaid, getRow } from './orderQueries';
import { assertTransition, transition, type OrderActor } from './orderTransitions';
import { sellableVariants } from './shopCatalogue';

/** 503 for a provider that cannot be reached or fails on its side; nothing was written. */
function providerDown(err: unknown): HttpError {
  const detail = err instanceof Error ? err.message : String(err);
  return new HttpError(
    503,
    'payments_unavailable',
    'We could not reach the payment service, so nothing was charged and no order was made. Please try again in a few minutes.',
    { provider: detail.slice(0, 200) },
  );
}

/** True for SDK errors that mean "the provider is down or unreachable" rather than "your request is wrong". */
function isProviderOutage(err: unknown): boolean {
  const type = (err as { type?: string } | null)?.type;
  return type === 'StripeConnectionError' || type === 'StripeAPIError' || type === 'StripeRateLimitError';
}

/**
 * Prices a cart on the server: unknown or retired SKUs are a 400 naming the line.
 * @param ctx - app context
 * @param items - SKUs and quantities
 * @param country - destination country
 */
export async function quoteCart(ctx: AppContext, items: CheckoutRequest['items'], country: string): Promise<ShopQuote> {
  const merged = new Map<string, { quantity: number; index: number }>();
  items.forEach((item, index) => {
    const seen = merged.get(item.sku);
    merged.set(item.sku, { quantity: (seen?.quantity ?? 0) + item.quantity, index: seen?.index ?? index });
  });
  const { bySku, settings } = await sellableVariants(ctx, [...merged.keys()]);
  const lines: CartLine[] = [];
  for (const [sku, { quantity, index }] of merged) {
    const variant = bySku.get(sku);
    if (!variant) throw fieldProblem(`items.${index}.sku`, `SKU ${sku} is not on sale (unknown, or no longer sold).`);
    if (quantity > 50) throw fieldProblem(`items.${index}.quantity`, 'One order can hold at most 50 of one product.');
    lines.push({ variant, quantity });
  }
  try {
    return priceCart(lines, country, settings);
  } catch (err) {
    if (err instanceof CartPricingError)
      throw badRequest(err.message, [{ in: 'body', path: err.field, message: err.message }]);
    throw err;
  }
}

/**
 * Starts a checkout: prices the cart, opens a session at the provider, then stores the order (placed). When the
 * provider cannot be reached the answer is 503 and no order is stored.
 * @param ctx - app context
 * @param body - e-mail, address and cart (validated)
 * @param siteOrigin - the shop's address, for the return links
 */
export async function startCheckout(
  ctx: AppContext,
  body: CheckoutRequest,
  siteOrigin: string,
): Promise<CheckoutResponse> {
  const quote = await quoteCart(ctx, body.items, body.shipTo.country);
  const { settings } = await sellableVariants(ctx, []);
  const payments = paymentsOf(ctx);
  const orderId = newId();
  const customerToken = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + settings.shop.checkoutExpiryMin * 60_000);
  const currency = quote.currency.toLowerCase();
  let session: Stripe.Checkout.Session;
  try {
    session = await payments.client.checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [
          ...quote.lines.map((line) => ({
            quantity: line.quantity,
            price_data: {
              currency,
              unit_amount: line.unitPriceMinor,
              product_data: { name: `${line.productName} (${line.sku})` },
            },
          })),
          {
            quantity: 1,
            price_data: {
              currency,
              unit_amount: quote.shippingMinor,
              product_data: { name: `Shipping, ${quote.shippingZone}` },
            },
          },
        ],
        customer_email: body.email,
        client_reference_id: orderId,
        metadata: { orderId },
        success_url: `${siteOrigin}/shop/orders/${customerToken}?from=payment`,
        cancel_url: `${siteOrigin}/shop/cart`,
        expires_at: Math.floor(expiresAt.getTime() / 1000),
      },
      { idempotencyKey: `checkout-${orderId}` },
    );
  } catch (err) {
    if (isProviderOutage(err)) throw providerDown(err);
    throw err;
  }
  if (!session.url) throw providerDown(new Error('the checkout session has no payment page'));
  if (session.amount_total !== null && session.amount_total !== quote.totalMinor)
    throw providerDown(
      new Error(`the provider priced the session at ${session.amount_total}, not ${quote.totalMinor}`),
    );
  await createFromCheckout(ctx.db, {
    id: orderId,
    customerToken,
    email: body.email,
    shipTo: body.shipTo,
    quote,
    paymentSessionId: session.id,
    expiresAt,
    siteOrigin,
  });
  return { orderId, checkoutUrl: session.url };
}

/** What applying one provider event did. */
export interface PaymentEventResult {
  eventId: string;
  type: string;
  /** False when the event was seen before (a replay). */
  applied: boolean;
  outcome: string;
}

/**
 * Verifies a webhook with the SDK's `constructEvent` (400 `bad_signature` and nothing changes when it fails), then
 * applies it once: events are stored by id, so a replay finds its row and does nothing.
 * @param ctx - app context
 * @param rawBody - the exact bytes received
 * @param signature - the signature header
 */
export async function handlePaymentWebhook(
  ctx: AppContext,
  rawBody: Buffer,
  signature: string | undefined,
): Promise<PaymentEventResult> {
  const payments = paymentsOf(ctx);
  let event: Stripe.Event;
  try {
    if (!signature) throw new Error('no signature header');
    event = payments.client.webhooks.constructEvent(rawBody, signature, payments.webhookSecret);
  } catch (err) {
    throw new HttpError(
      400,
      'bad_signature',
      `The webhook signature did not verify: ${err instanceof Error ? err.message : 'unknown error'}`,
    );
  }
  const result = await ctx.db.transaction(async (tx) => {
    const inserted = await tx
      .insert(paymentEvents)
      .values({
        id: event.id,
        type: event.type,
        outcome: 'received',
        payload: event as unknown as Record<string, unknown>,
      })
      .onConflictDoNothing()
      .returning({ id: paymentEvents.id });
    if (inserted.length === 0)
      return { eventId: event.id, type: event.type, applied: false, outcome: 'replay ignored' };
    const { outcome, orderId } = await applyEvent(tx as unknown as AppContext['db'], event);
    await tx.update(paymentEvents).set({ outcome, orderId }).where(eqId(event.id));
    return { eventId: event.id, type: event.type, applied: true, outcome };
  });
  kickMail(ctx);
  return result;
}

function eqId(id: string) {
  return eq(paymentEvents.id, id);
}

async function applyEvent(
  db: AppContext['db'],
  event: Stripe.Event,
): Promise<{ outcome: string; orderId: string | null }> {
  if (event.type !== 'checkout.session.completed' && event.type !== 'checkout.session.expired')
    return { outcome: 'ignored', orderId: null };
  const session = event.data.object;
  const orderId = session.client_reference_id ?? session.metadata?.orderId ?? null;
  const [row] = orderId ? await db.select().from(orders).where(eq(orders.id, orderId)) : [];
  if (!row) return { outcome: 'no such order', orderId: null };
  if (event.type === 'checkout.session.expired') {
    if (row.state !== 'placed' || row.paidAt) return { outcome: `expired ignored (${row.state})`, orderId: row.id };
    await transition(db, row.id, 'cancelled', null, { reason: 'the checkout expired unpaid' });
    return { outcome: 'cancelled (expired)', orderId: row.id };
  }
  if (session.payment_status !== 'paid') return { outcome: `not paid (${session.payment_status})`, orderId: row.id };
  const paymentIntentId =
    typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null);
  const outcome = await markPaid(db, row.id, {
    paymentIntentId,
    amountMinor: session.amount_total ?? -1,
    currency: session.currency ?? '',
    eventId: event.id,
  });
  return { outcome, orderId: row.id };
}

/**
 * Cancels an order: an unpaid one is cancelled (its checkout session expired at the provider); a paid one is
 * refunded in full through the SDK, then marked refunded (the customer is mailed). 409 when its state allows neither.
 * @param ctx - app context
 * @param orderId - the order
 * @param actor - who cancels
 * @param reason - why, kept in the history
 */
export async function cancelOrder(ctx: AppContext, orderId: string, actor: OrderActor, reason: string) {
  const row = await getRow(ctx.db, orderId);
  const payments = paymentsOf(ctx);
  if (row.state === 'placed' && !row.paidAt) {
    assertTransition(row, 'cancelled');
    if (row.paymentSessionId) {
      try {
        await payments.client.checkout.sessions.expire(row.paymentSessionId);
      } catch (err) {
        if (isProviderOutage(err)) throw providerDown(err);
        // Already expired, or paid a moment ago: look again before cancelling.
        const session = await payments.client.checkout.sessions.retrieve(row.paymentSessionId).catch(() => null);
        if (session?.payment_status === 'paid')
          throw conflict(
            'paid_meanwhile',
            `Order ${formatOrderNumber(row.number)} was paid a moment ago: reload it and refund it instead.`,
          );
      }
    }
    const order = await transition(ctx.db, orderId, 'cancelled', actor, { reason });
    kickMail(ctx);
    return order;
  }
  const target = row.state === 'placed' ? 'cancelled' : 'refunded';
  assertTransition(row, target);
  if (!row.paymentIntentId)
    throw conflict('no_payment', `Order ${formatOrderNumber(row.number)} has no payment to refund.`);
  let refund: Stripe.Refund;
  try {
    refund = await payments.client.refunds.create(
      { payment_intent: row.paymentIntentId, reason: 'requested_by_customer', metadata: { orderId } },
      { idempotencyKey: `refund-${orderId}` },
    );
  } catch (err) {
    if (isProviderOutage(err)) throw providerDown(err);
    throw conflict(
      'refund_refused',
      `The payment service refused the refund: ${err instanceof Error ? err.message : String(err)}`,
    );
  }
  const order = await transition(ctx.db, orderId, target, actor, {
    reason,
    refundId: refund.id,
    refundedMinor: refund.amount,
  });
  kickMail(ctx);
  return order;
}

/**
 * Cancels every unpaid order whose checkout has expired (its session expired at the provider first, so a late
 * payment cannot land on a cancelled order). Returns how many were cancelled.
 * @param ctx - app context
 * @param now - the time to compare with
 */
export async function expireAbandonedCheckouts(ctx: AppContext, now = new Date()): Promise<number> {
  let cancelled = 0;
  for (const row of await expiredUnpaid(ctx.db, now)) {
    try {
      await cancelOrder(ctx, row.id, null, 'the checkout expired unpaid');
      cancelled += 1;
    } catch (err) {
      // Paid at the last moment, cancelled meanwhile, or the provider is down: the next sweep looks again.
      if (!(err instanceof HttpError)) throw err;
      ctx.log(`Checkout expiry of order ${formatOrderNumber(row.number)}: ${err.message}`);
    }
  }
  return cancelled;
}
