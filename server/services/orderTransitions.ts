/**
 * Order transitions: an order moves to a new state only when its state allows it (409 otherwise); each move is
 * guarded against a concurrent change, audited under `order:<id>`, runs the transition hooks and queues the
 * customer's mail in the same transaction.
 */
import { and, eq } from 'drizzle-orm';
import {
  canTransition,
  formatOrderNumber,
  ORDER_STATE_LABELS,
  type Order,
  type OrderState,
} from '../../shared/schemas/order';
import type { Db, Queryable } from '../db/client';
import { orders, type OrderRow } from '../db/schema';
import { conflict, notFound } from '../http/HttpError';
import { queueMail } from '../mail/queueMail';
import { recordAudit } from './audit';
import { orderMail } from './orderMail';
import { linesOf, subjectOf, toOrder } from './orderQueries';
import { getStudio } from './studio';
import { runOrderTransitionHooks } from './orderHooks';

/** Who acts on an order: a signed-in person, or null for the customer, the provider or the system. */
export type OrderActor = { id: string } | null;

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

/** The order row, locked for this transaction (404 when unknown). */
export async function lockOrder(tx: Queryable, orderId: string): Promise<OrderRow> {
  const [row] = await tx.select().from(orders).where(eq(orders.id, orderId)).for('update');
  if (!row) throw notFound('No such order.');
  return row;
}

/** Changes the state (guarded by the old state in the WHERE), audits, runs hooks, queues the customer's mail. */
export async function moveState(
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
