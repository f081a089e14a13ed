/**
 * Orders, the commands: created from a checkout, marked paid by the payment provider's event, and a payment flag
 * cleared by a person; every step audited under `order:<id>`, customer mail queued in the same transaction. The
 * guarded state changes are in `orderTransitions.ts`, the reads in `orderQueries.ts`. No HTTP here: routes and the
 * webhook handler call these named functions.
 */
import { eq } from 'drizzle-orm';
import { formatOrderNumber, type Order, type PaymentFlag } from '../../shared/schemas/order';
import type { ShipTo, ShopQuote } from '../../shared/schemas/shop';
import type { Db } from '../db/client';
import { orderLines, orders } from '../db/schema';
import { conflict } from '../http/HttpError';
import { recordAudit } from './audit';
import { linesOf, orderLineOf, subjectOf, toOrder } from './orderQueries';
import { assertTransition, lockOrder, moveState, type OrderActor } from './orderTransitions';

/** What {@link createFromCheckout} needs: the priced cart (computed on the server) and the provider's session. */
export interface NewOrder {
  /** Chosen before the provider is called, so the session can carry it. */
  id: string;
  customerToken: string;
  email: string;
  shipTo: ShipTo;
  quote: ShopQuote;
  paymentSessionId: string;
  expiresAt: Date;
  siteOrigin: string;
}

/**
 * Stores a new order in state `placed` with its lines, and audits it. One transaction: all or nothing.
 * @param db - database
 * @param input - the priced order and its checkout session
 */
export async function createFromCheckout(db: Db, input: NewOrder): Promise<Order> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(orders)
      .values({
        id: input.id,
        customerToken: input.customerToken,
        email: input.email,
        shipTo: input.shipTo,
        currency: input.quote.currency,
        subtotalMinor: input.quote.subtotalMinor,
        shippingMinor: input.quote.shippingMinor,
        vatMinor: input.quote.vatMinor,
        vatRatePct: input.quote.vatRatePct,
        totalMinor: input.quote.totalMinor,
        paymentSessionId: input.paymentSessionId,
        expiresAt: input.expiresAt,
        siteOrigin: input.siteOrigin,
      })
      .returning();
    const lines = await tx
      .insert(orderLines)
      .values(
        input.quote.lines.map((line, position) => ({
          orderId: row.id,
          position,
          ...orderLineOf(line),
        })),
      )
      .returning();
    await recordAudit(tx, {
      actorId: null,
      action: 'order.placed',
      subject: subjectOf(row.id),
      details: { number: formatOrderNumber(row.number), totalMinor: row.totalMinor, currency: row.currency },
    });
    return toOrder(row, lines);
  });
}

/** What the provider reported about a completed payment. */
export interface PaymentReport {
  paymentIntentId: string | null;
  amountMinor: number;
  currency: string;
  /** The provider's event id, kept in the history. */
  eventId: string;
}

/** Outcome of {@link markPaid}. */
export type MarkPaidOutcome = 'paid' | 'already_paid' | 'flagged' | 'not_payable';

/**
 * Applies a completed payment: when amount and currency match the order's total the order becomes `paid`
 * (hooks run, confirmation mail queued); otherwise it is flagged and stays unfulfilled for a person to look at.
 * @param db - database
 * @param orderId - the order
 * @param report - what the provider says was paid
 */
export async function markPaid(db: Db, orderId: string, report: PaymentReport): Promise<MarkPaidOutcome> {
  return db.transaction(async (tx) => {
    const row = await lockOrder(tx, orderId);
    if (row.state !== 'placed') return row.paidAt ? 'already_paid' : 'not_payable';
    const flag: PaymentFlag | null =
      report.currency.toUpperCase() !== row.currency
        ? 'currency_mismatch'
        : report.amountMinor !== row.totalMinor
          ? 'amount_mismatch'
          : null;
    const paid = { paymentIntentId: report.paymentIntentId, paidMinor: report.amountMinor, paidAt: new Date() };
    if (flag) {
      await tx
        .update(orders)
        .set({ ...paid, paymentFlag: flag, updatedAt: new Date() })
        .where(eq(orders.id, orderId));
      await recordAudit(tx, {
        actorId: null,
        action: 'order.payment_flagged',
        subject: subjectOf(orderId),
        details: {
          flag,
          expectedMinor: row.totalMinor,
          paidMinor: report.amountMinor,
          currency: report.currency.toUpperCase(),
          eventId: report.eventId,
        },
      });
      return 'flagged';
    }
    await moveState(tx, row, 'paid', null, { eventId: report.eventId, paidMinor: report.amountMinor }, paid);
    return 'paid';
  });
}

/**
 * Clears the payment flag of an order once a person has checked the payment with the provider and accepts it: the
 * order becomes `paid` (hooks run, so it goes to the farm; the confirmation mail is queued) and both steps are
 * audited with the person's note. 409 when the order carries no flag or is no longer waiting for its payment.
 * @param db - database
 * @param orderId - the order
 * @param actor - who accepts the payment
 * @param note - what they checked (kept in the history)
 */
export async function clearPaymentFlag(db: Db, orderId: string, actor: OrderActor, note: string): Promise<Order> {
  return db.transaction(async (tx) => {
    const row = await lockOrder(tx, orderId);
    if (row.paymentFlag === null)
      throw conflict('not_flagged', `Order ${formatOrderNumber(row.number)} has no payment flag to clear.`);
    assertTransition(row, 'paid');
    await recordAudit(tx, {
      actorId: actor?.id ?? null,
      action: 'order.flag_cleared',
      subject: subjectOf(orderId),
      details: { flag: row.paymentFlag, paidMinor: row.paidMinor, expectedMinor: row.totalMinor, note },
    });
    const updated = await moveState(tx, row, 'paid', actor, { note }, { paymentFlag: null });
    return toOrder(updated, await linesOf(tx, [orderId]));
  });
}
