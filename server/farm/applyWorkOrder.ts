/**
 * Applies what the farm says about a work order (from a notice, a status query or the create answer) to our
 * dispatch row, audits every change under the order with the farm's ids, and moves the order along: printing makes
 * a paid order "in production", handed to the carrier makes it "shipped" with the tracking link (the customer's
 * shipped mail is queued by that transition). Stages never go backwards, so late or repeated news changes nothing.
 */
import { and, eq, inArray, or } from 'drizzle-orm';
import type { WorkOrder, WorkOrderStage } from '../../shared/schemas/farm';
import type { DispatchStatus } from '../../shared/schemas/fulfilment';
import type { AppContext } from '../context';
import { farmDispatches, orders, type FarmDispatchRow } from '../db/schema';
import { recordAudit } from '../services/audit';
import { subjectOf } from '../services/orderQueries';
import { transition } from '../services/orderTransitions';

const STAGE_RANK: Record<WorkOrderStage, number> = {
  accepted: 0,
  scheduled: 1,
  on_hold: 1,
  printing: 2,
  packing: 3,
  handed_over: 4,
  withdrawn: 5,
};

const STATUS_OF_STAGE: Partial<Record<WorkOrderStage, DispatchStatus>> = {
  on_hold: 'held',
  handed_over: 'done',
  withdrawn: 'withdrawn',
};

/** Where the news came from (kept in the audit trail). */
export type FarmNewsSource = 'notice' | 'poll' | 'dispatch';

/**
 * Applies a work-order snapshot; unknown work orders are ignored.
 * @param ctx - app context
 * @param workOrder - what the farm reports
 * @param source - notice, poll or the dispatch answer
 * @returns false when no dispatch has this work order
 */
export async function applyWorkOrder(ctx: AppContext, workOrder: WorkOrder, source: FarmNewsSource): Promise<boolean> {
  const row = await ctx.db.transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(farmDispatches)
      .where(eq(farmDispatches.farmWorkOrderId, workOrder.id))
      .for('update');
    if (!current) return undefined;
    const now = new Date();
    const subject = current.orderId ? subjectOf(current.orderId) : `farm_run:${current.runId}`;
    const base = { farmWorkOrderId: workOrder.id, via: source };
    const set: Partial<typeof farmDispatches.$inferInsert> = { farmCheckedAt: now };
    const reprints = workOrder.lines.reduce((sum, line) => sum + line.reprints, 0);
    if (reprints > current.reprints) {
      set.reprints = reprints;
      set.reprintsBySku = Object.fromEntries(workOrder.lines.map((line) => [line.lineRef, line.reprints]));
      set.farmChangedAt = now;
      await recordAudit(tx, {
        actorId: null,
        action: 'farm.reprint',
        subject,
        details: { ...base, reprints, lines: workOrder.lines.filter((l) => l.reprints > 0).map((l) => l.lineRef) },
      });
    }
    const forward =
      current.status !== 'withdrawn' &&
      (current.farmStage === null || STAGE_RANK[workOrder.stage] > STAGE_RANK[current.farmStage]);
    if (forward) {
      set.farmStage = workOrder.stage;
      set.farmChangedAt = now;
      set.status = STATUS_OF_STAGE[workOrder.stage] ?? 'at_farm';
      if (workOrder.hold) {
        set.holdCode = workOrder.hold.code;
        set.holdMessage = workOrder.hold.message;
      }
      if (workOrder.parcel) {
        set.carrier = workOrder.parcel.carrier;
        set.trackingCode = workOrder.parcel.trackingCode;
        set.trackingUrl = workOrder.parcel.trackingUrl;
      }
      await recordAudit(tx, {
        actorId: null,
        action: workOrder.stage === 'on_hold' ? 'farm.held' : 'farm.stage',
        subject,
        details: {
          ...base,
          stage: workOrder.stage,
          ...(workOrder.hold ? { hold: workOrder.hold.code, message: workOrder.hold.message } : {}),
          ...(workOrder.parcel
            ? { carrier: workOrder.parcel.carrier, trackingCode: workOrder.parcel.trackingCode }
            : {}),
        },
      });
    }
    set.updatedAt = now;
    const [updated] = await tx.update(farmDispatches).set(set).where(eq(farmDispatches.id, current.id)).returning();
    return updated;
  });
  if (!row) return false;
  await syncOrder(ctx, row);
  return true;
}

/**
 * Moves the order of a dispatch as far as the farm has got: in production once printing started, shipped once
 * handed to the carrier. Safe to call any number of times (it only moves forward, and only from the states it
 * expects), so reconciliation calls it too.
 * @param ctx - app context
 * @param row - the dispatch
 */
export async function syncOrder(ctx: AppContext, row: FarmDispatchRow): Promise<void> {
  if (!row.orderId || !row.farmStage || row.status === 'withdrawn') return;
  const rank = STAGE_RANK[row.farmStage];
  const [order] = await ctx.db.select({ state: orders.state }).from(orders).where(eq(orders.id, row.orderId));
  if (!order) return;
  const note = `farm work order ${row.farmWorkOrderId}`;
  if (order.state === 'paid' && rank >= STAGE_RANK.printing && row.farmStage !== 'on_hold')
    await transition(ctx.db, row.orderId, 'in_production', null, { note }).catch(ignoreRace);
  if (row.status === 'done' && row.trackingUrl) {
    const [now] = await ctx.db.select({ state: orders.state }).from(orders).where(eq(orders.id, row.orderId));
    if (now?.state === 'in_production')
      await transition(ctx.db, row.orderId, 'shipped', null, {
        trackingUrl: row.trackingUrl,
        note: `${row.carrier ?? 'carrier'} ${row.trackingCode ?? ''} (${note})`.trim(),
      }).catch(ignoreRace);
  }
}

/**
 * Dispatches whose order lags behind the farm (e.g. a crash after a notice was stored): moves those orders on.
 * @param ctx - app context
 */
export async function syncLaggingOrders(ctx: AppContext): Promise<number> {
  const rows = await ctx.db
    .select({ dispatch: farmDispatches })
    .from(farmDispatches)
    .innerJoin(orders, eq(orders.id, farmDispatches.orderId))
    .where(
      or(
        and(
          eq(orders.state, 'paid'),
          inArray(farmDispatches.farmStage, ['printing', 'packing', 'handed_over']),
          inArray(farmDispatches.status, ['at_farm', 'done']),
        ),
        and(eq(orders.state, 'in_production'), eq(farmDispatches.status, 'done')),
      ),
    );
  for (const { dispatch } of rows) await syncOrder(ctx, dispatch);
  return rows.length;
}

/** Another process moved the order first (409): nothing to do. */
function ignoreRace(err: unknown): void {
  if (err && typeof err === 'object' && 'status' in err && (err as { status: number }).status === 409) return;
  throw err;
}
