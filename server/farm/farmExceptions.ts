/**
 * Acting on the exceptions queue: a held dispatch is withdrawn at the farm and either sent again (with a corrected
 * address, or once the colour is back) as a new dispatch with its own idempotency key, or withdrawn for good so the
 * order can be refunded. Every step is audited under the order.
 */
import { eq } from 'drizzle-orm';
import type { RedispatchRequest } from '../../shared/schemas/fulfilment';
import type { AppContext } from '../context';
import { farmDispatches, orders, type FarmDispatchRow } from '../db/schema';
import { conflict, HttpError, notFound } from '../http/HttpError';
import { recordAudit } from '../services/audit';
import { subjectOf } from '../services/orderQueries';
import { dispatchKey } from './dispatchOrders';
import { FarmError } from './FarmClient';
import { farmRuntime } from './farmRuntime';

/**
 * The dispatch row (404 when unknown).
 * @param ctx - app context
 * @param id - dispatch id
 */
export async function getDispatch(ctx: AppContext, id: number): Promise<FarmDispatchRow> {
  const [row] = await ctx.db.select().from(farmDispatches).where(eq(farmDispatches.id, id));
  if (!row) throw notFound('No such dispatch.');
  return row;
}

/** Withdraws the work order at the farm when it has one that is not finished (503 when the farm is unreachable). */
async function withdrawAtFarm(ctx: AppContext, row: FarmDispatchRow): Promise<void> {
  if (!row.farmWorkOrderId || row.farmStage === 'withdrawn') return;
  const runtime = farmRuntime(ctx);
  if (!runtime) throw new HttpError(503, 'farm_not_started', 'The farm is not connected in this process.');
  try {
    await runtime.client.withdrawWorkOrder(row.farmWorkOrderId);
  } catch (err) {
    if (err instanceof FarmError && err.status === 409)
      throw conflict('too_late', 'The farm has started printing this order: it can no longer be withdrawn.');
    if (err instanceof FarmError)
      throw new HttpError(503, 'farm_unavailable', `The farm could not be reached (${err.message}); try again.`);
    throw err;
  }
}

/**
 * Sends a held dispatch again: withdraws the held work order, stores a corrected address when given, and queues a
 * new dispatch (next attempt, new key) in one transaction.
 * @param ctx - app context
 * @param id - the held dispatch
 * @param request - corrected address and a note
 * @param actorId - who did it
 * @returns the new dispatch row
 */
export async function redispatch(
  ctx: AppContext,
  id: number,
  request: RedispatchRequest,
  actorId: string,
): Promise<FarmDispatchRow> {
  const row = await getDispatch(ctx, id);
  if (row.status !== 'held')
    throw conflict('not_held', 'Only a dispatch the farm holds (or refused) can be sent again.');
  await withdrawAtFarm(ctx, row);
  const subject = row.orderId ? subjectOf(row.orderId) : `farm_run:${row.runId}`;
  const next = await ctx.db.transaction(async (tx) => {
    const [withdrawn] = await tx
      .update(farmDispatches)
      .set({ status: 'withdrawn', farmStage: row.farmWorkOrderId ? 'withdrawn' : row.farmStage, updatedAt: new Date() })
      .where(eq(farmDispatches.id, row.id))
      .returning({ id: farmDispatches.id });
    if (!withdrawn) throw conflict('state_changed', 'The dispatch changed meanwhile: reload and try again.');
    if (request.shipTo && row.orderId) {
      const [order] = await tx.select({ shipTo: orders.shipTo }).from(orders).where(eq(orders.id, row.orderId));
      await tx.update(orders).set({ shipTo: request.shipTo, updatedAt: new Date() }).where(eq(orders.id, row.orderId));
      await recordAudit(tx, {
        actorId,
        action: 'order.address_corrected',
        subject,
        details: { from: order?.shipTo ?? null, to: request.shipTo, ...(request.note ? { note: request.note } : {}) },
      });
    }
    const attempt = row.attempt + 1;
    const subjectKey = row.orderId ? `order:${row.orderId}` : `run:${row.runId}`;
    const [created] = await tx
      .insert(farmDispatches)
      .values({ orderId: row.orderId, runId: row.runId, attempt, idempotencyKey: dispatchKey(subjectKey, attempt) })
      .returning();
    await recordAudit(tx, {
      actorId,
      action: 'farm.redispatched',
      subject,
      details: {
        withdrawnFarmWorkOrderId: row.farmWorkOrderId,
        hold: row.holdCode,
        attempt,
        ...(request.note ? { note: request.note } : {}),
      },
    });
    return created;
  });
  farmRuntime(ctx)?.nudge();
  return next;
}

/**
 * Withdraws a held dispatch for good (before the order is refunded).
 * @param ctx - app context
 * @param id - the held dispatch
 * @param reason - why
 * @param actorId - who did it
 */
export async function withdrawDispatch(ctx: AppContext, id: number, reason: string, actorId: string): Promise<void> {
  const row = await getDispatch(ctx, id);
  if (row.status !== 'held' && row.status !== 'waiting' && row.status !== 'queued')
    throw conflict('not_withdrawable', 'This dispatch is already at work at the farm or finished.');
  await withdrawAtFarm(ctx, row);
  await ctx.db.transaction(async (tx) => {
    await tx
      .update(farmDispatches)
      .set({ status: 'withdrawn', farmStage: row.farmWorkOrderId ? 'withdrawn' : row.farmStage, updatedAt: new Date() })
      .where(eq(farmDispatches.id, row.id));
    await recordAudit(tx, {
      actorId,
      action: 'farm.withdrawn',
      subject: row.orderId ? subjectOf(row.orderId) : `farm_run:${row.runId}`,
      details: { farmWorkOrderId: row.farmWorkOrderId, reason },
    });
  });
}
