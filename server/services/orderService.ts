/**
 * Orders: created from a checkout, marked paid by the payment provider's event, moved along guarded transitions
 * (409 when the state does not allow it), every step audited under `order:<id>`, customer mail queued in the same
 * transaction. No HTTP here: routes and the webhook handler call these named functions.
 */
import { and, asc, count, desc, eq, ilike, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import {
  canTransition,
  formatOrderNumber,
  ORDER_STATE_LABELS,
  type CustomerOrder,
  type Order,
  type OrderDetail,
  type OrderListQuery,
  type OrderListResponse,
  type OrderState,
  type PaymentFlag,
} from '../../shared/schemas/order';
import type { ShipTo, ShopQuote } from '../../shared/schemas/shop';
import type { Db, Queryable } from '../db/client';
import { auditEvents, orderLines, orders, people, type OrderLineRow, type OrderRow } from '../db/schema';
import { conflict, notFound } from '../http/HttpError';
import { queueMail } from '../mail/queueMail';
import { fulfilmentOf } from '../farm/farmViews';
import { recordAudit } from './audit';
import { orderMail } from './orderMail';
import { getStudio } from './studio';
import { runOrderTransitionHooks } from './orderHooks';

/** Who acts on an order: a signed-in person, or null for the customer, the provider or the system. */
export type OrderActor = { id: string } | null;

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
          sku: line.sku,
          productName: line.productName,
          meshSha256: line.meshSha256,
          quantity: line.quantity,
          unitPriceMinor: line.unitPriceMinor,
          lineTotalMinor: line.lineTotalMinor,
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

/** Extra fields some transitions set. */
export interface TransitionExtras {
  trackingUrl?: string;
  refundId?: string;
  refundedMinor?: number;
  note?: string;
  reason?: string;
}

/**
 * Moves an order to `to` when its state allows it (409 `invalid_transition` otherwise), audits it, runs the hooks
 * and queues the customer's mail for shipped and refunded.
 * @param db - database
 * @param orderId - the order
 * @param to - the new state
 * @param actor - who did it (null: the system)
 * @param extras - tracking link, refund, note
 */
export async function transition(
  db: Db,
  orderId: string,
  to: OrderState,
  actor: OrderActor,
  extras: TransitionExtras = {},
): Promise<Order> {
  return db.transaction(async (tx) => {
    const row = await lockOrder(tx, orderId);
    assertTransition(row, to);
    const set: Partial<typeof orders.$inferInsert> = {};
    if (extras.trackingUrl) set.trackingUrl = extras.trackingUrl;
    if (extras.refundId) set.refundId = extras.refundId;
    if (extras.refundedMinor !== undefined) set.refundedMinor = extras.refundedMinor;
    const details: Record<string, unknown> = {};
    for (const key of ['trackingUrl', 'refundId', 'refundedMinor', 'note', 'reason'] as const)
      if (extras[key] !== undefined) details[key] = extras[key];
    const updated = await moveState(tx, row, to, actor, details, set);
    return toOrder(updated, await linesOf(tx, [orderId]));
  });
}

/**
 * 409 unless `row` may move to `to` (used before side effects such as a refund at the provider).
 * @param row - the order
 * @param to - the wanted state
 */
export function assertTransition(row: Pick<OrderRow, 'state' | 'number'>, to: OrderState): void {
  if (!canTransition(row.state, to))
    throw conflict(
      'invalid_transition',
      `Order ${formatOrderNumber(row.number)} is ${ORDER_STATE_LABELS[row.state].toLowerCase()}: it cannot become ${ORDER_STATE_LABELS[to].toLowerCase()}.`,
    );
}

/**
 * Orders, newest first, filtered by state, flag and a search over number, e-mail, name and SKU.
 * @param db - database
 * @param query - filter and page
 */
export async function list(db: Db, query: OrderListQuery): Promise<OrderListResponse> {
  const where = listFilter(query);
  const [{ total }] = await db.select({ total: count() }).from(orders).where(where);
  const rows = await db
    .select()
    .from(orders)
    .where(where)
    .orderBy(desc(orders.number))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const lines = await linesOf(
    db,
    rows.map((row) => row.id),
  );
  return {
    orders: rows.map((row) => toOrder(row, lines)),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

/**
 * Every order matching the filter, oldest first (CSV export), at most `limit`.
 * @param db - database
 * @param query - filter (page ignored)
 * @param limit - most rows
 */
export async function listAll(
  db: Db,
  query: Omit<OrderListQuery, 'page' | 'pageSize'>,
  limit = 50_000,
): Promise<Order[]> {
  const rows = await db.select().from(orders).where(listFilter(query)).orderBy(asc(orders.number)).limit(limit);
  const lines = await linesOf(
    db,
    rows.map((row) => row.id),
  );
  return rows.map((row) => toOrder(row, lines));
}

/**
 * One order with its history (404 when unknown).
 * @param db - database
 * @param orderId - the order
 */
export async function get(db: Db, orderId: string): Promise<OrderDetail> {
  const [row] = await db.select().from(orders).where(eq(orders.id, orderId));
  if (!row) throw notFound('No such order.');
  const history = await db
    .select({ at: auditEvents.at, action: auditEvents.action, details: auditEvents.details, actor: people.name })
    .from(auditEvents)
    .leftJoin(people, eq(people.id, auditEvents.actorId))
    .where(eq(auditEvents.subject, subjectOf(orderId)))
    .orderBy(asc(auditEvents.id));
  return {
    ...toOrder(row, await linesOf(db, [orderId])),
    history: history.map((entry) => ({
      at: entry.at.toISOString(),
      action: entry.action,
      actor: entry.actor ?? null,
      details: entry.details,
    })),
    fulfilment: await fulfilmentOf(db, orderId),
  };
}

/**
 * The stored row of an order (404 when unknown), for callers that act at the provider first.
 * @param db - database
 * @param orderId - the order
 */
export async function getRow(db: Db, orderId: string): Promise<OrderRow> {
  const [row] = await db.select().from(orders).where(eq(orders.id, orderId));
  if (!row) throw notFound('No such order.');
  return row;
}

/**
 * The order behind a customer's private link, as the customer sees it (404 for any other token).
 * @param db - database
 * @param token - the secret from the link
 */
export async function getForCustomer(db: Db, token: string): Promise<CustomerOrder> {
  const [row] = await db.select().from(orders).where(eq(orders.customerToken, token));
  if (!row) throw notFound('No order behind this link.');
  const order = toOrder(row, await linesOf(db, [row.id]));
  return {
    number: order.number,
    state: order.state,
    shipTo: order.shipTo,
    currency: order.currency,
    lines: order.lines,
    subtotalMinor: order.subtotalMinor,
    shippingMinor: order.shippingMinor,
    vatMinor: order.vatMinor,
    vatRatePct: order.vatRatePct,
    totalMinor: order.totalMinor,
    trackingUrl: order.trackingUrl,
    createdAt: order.createdAt,
    paid: row.paidAt !== null && row.paymentFlag === null,
  };
}

/**
 * Unpaid orders whose checkout has expired by `now`.
 * @param db - database
 * @param now - the time to compare with
 */
export async function expiredUnpaid(db: Db, now = new Date()): Promise<OrderRow[]> {
  return db
    .select()
    .from(orders)
    .where(and(eq(orders.state, 'placed'), sql`${orders.expiresAt} <= ${now}`, sql`${orders.paidAt} is null`));
}

/** The audit subject of an order. @param orderId - the order */
export function subjectOf(orderId: string): string {
  return `order:${orderId}`;
}

async function lockOrder(tx: Queryable, orderId: string): Promise<OrderRow> {
  const [row] = await tx.select().from(orders).where(eq(orders.id, orderId)).for('update');
  if (!row) throw notFound('No such order.');
  return row;
}

/** Changes the state (guarded by the old state in the WHERE), audits, runs hooks, queues the customer's mail. */
async function moveState(
  tx: Queryable,
  row: OrderRow,
  to: OrderState,
  actor: OrderActor,
  details: Record<string, unknown>,
  set: Partial<typeof orders.$inferInsert>,
): Promise<OrderRow> {
  assertTransition(row, to);
  const [updated] = await tx
    .update(orders)
    .set({ ...set, state: to, updatedAt: new Date() })
    .where(and(eq(orders.id, row.id), eq(orders.state, row.state)))
    .returning();
  if (!updated) throw conflict('state_changed', 'The order changed meanwhile: reload it and try again.');
  await recordAudit(tx, {
    actorId: actor?.id ?? null,
    action: `order.${to}`,
    subject: subjectOf(row.id),
    details: { from: row.state, to, ...details },
  });
  await runOrderTransitionHooks({ tx, order: updated, from: row.state, to });
  const studio = await getStudio(tx);
  const mail = orderMail(updated, to, await linesOf(tx, [row.id]), studio.name, studio.locale);
  if (mail) await queueMail(tx, mail);
  return updated;
}

function listFilter(query: Pick<OrderListQuery, 'state' | 'q' | 'flagged'>): SQL | undefined {
  const conditions: Array<SQL | undefined> = [];
  if (query.state) conditions.push(eq(orders.state, query.state));
  if (query.flagged === 'true') conditions.push(isNotNull(orders.paymentFlag));
  if (query.q) {
    const q = query.q.trim();
    const pattern = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    const numberMatch = /^(?:nw-?)?(\d{1,9})$/i.exec(q);
    conditions.push(
      or(
        ilike(orders.email, pattern),
        sql`${orders.shipTo}->>'name' ilike ${pattern}`,
        sql`exists (select 1 from ${orderLines} where ${orderLines.orderId} = ${orders.id} and ${orderLines.sku} ilike ${pattern})`,
        numberMatch ? eq(orders.number, Number(numberMatch[1])) : undefined,
      ),
    );
  }
  return and(...conditions);
}

async function linesOf(db: Pick<Queryable, 'select'>, orderIds: string[]): Promise<OrderLineRow[]> {
  if (orderIds.length === 0) return [];
  return db
    .select()
    .from(orderLines)
    .where(inArray(orderLines.orderId, orderIds))
    .orderBy(asc(orderLines.orderId), asc(orderLines.position));
}

/**
 * An order row and its lines as the API shows them.
 * @param row - the order row
 * @param lines - lines of this and maybe other orders (filtered here)
 */
export function toOrder(row: OrderRow, lines: OrderLineRow[]): Order {
  return {
    id: row.id,
    number: formatOrderNumber(row.number),
    state: row.state,
    email: row.email,
    shipTo: row.shipTo,
    currency: row.currency,
    lines: lines
      .filter((line) => line.orderId === row.id)
      .map((line) => ({
        sku: line.sku,
        productName: line.productName,
        meshSha256: line.meshSha256,
        quantity: line.quantity,
        unitPriceMinor: line.unitPriceMinor,
        lineTotalMinor: line.lineTotalMinor,
      })),
    subtotalMinor: row.subtotalMinor,
    shippingMinor: row.shippingMinor,
    vatMinor: row.vatMinor,
    vatRatePct: row.vatRatePct,
    totalMinor: row.totalMinor,
    payment: {
      sessionId: row.paymentSessionId,
      paymentIntentId: row.paymentIntentId,
      paidMinor: row.paidMinor,
      paidAt: row.paidAt ? row.paidAt.toISOString() : null,
      flag: row.paymentFlag,
      refundId: row.refundId,
      refundedMinor: row.refundedMinor,
    },
    trackingUrl: row.trackingUrl,
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}
