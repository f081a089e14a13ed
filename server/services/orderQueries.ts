/**
 * Order queries: the list (filtered and paged), the CSV rows, one order with its history, the customer's view behind
 * a private link, and expired unpaid checkouts; and how an order row and its lines are shown by the API.
 */
import { and, asc, count, desc, eq, ilike, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import {
  formatOrderNumber,
  type CustomerOrder,
  type Order,
  type OrderDetail,
  type OrderListQuery,
  type OrderListResponse,
} from '../../shared/schemas/order';
import type { Db, Queryable } from '../db/client';
import { auditEvents, orderLines, orders, people, type OrderLineRow, type OrderRow } from '../db/schema';
import { notFound } from '../http/HttpError';
import { fulfilmentOf } from '../farm/farmViews';

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

/** The lines of the given orders, in order and position. */
export async function linesOf(db: Pick<Queryable, 'select'>, orderIds: string[]): Promise<OrderLineRow[]> {
  if (orderIds.length === 0) return [];
  return db
    .select()
    .from(orderLines)
    .where(inArray(orderLines.orderId, orderIds))
    .orderBy(asc(orderLines.orderId), asc(orderLines.position));
}

/**
 * What an order keeps of a line (and shows of it): SKU, name, mesh hash, quantity, unit price and line total.
 * @param line - a priced cart line or a stored order line
 */
export function orderLineOf(line: Order['lines'][number]): Order['lines'][number] {
  return {
    sku: line.sku,
    productName: line.productName,
    meshSha256: line.meshSha256,
    quantity: line.quantity,
    unitPriceMinor: line.unitPriceMinor,
    lineTotalMinor: line.lineTotalMinor,
  };
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
    lines: lines.filter((line) => line.orderId === row.id).map(orderLineOf),
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
