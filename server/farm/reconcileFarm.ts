/**
 * Reconciliation: asks the farm about every open work order we have heard nothing new about for a while, so a lost
 * notice does no harm, and moves on any order that lags behind what we already know.
 */
import { and, asc, eq, isNotNull, lt, or, isNull } from 'drizzle-orm';
import type { AppContext } from '../context';
import { farmDispatches } from '../db/schema';
import { applyWorkOrder, syncLaggingOrders } from './applyWorkOrder';
import { FarmError } from './FarmClient';
import type { FarmRuntime } from './farmRuntime';

/** Work orders asked about per round. */
const BATCH = 50;

/** What one round did. */
export interface ReconcileResult {
  asked: number;
  failed: number;
  ordersMoved: number;
}

/**
 * One reconciliation round.
 * @param ctx - app context
 * @param runtime - the farm
 * @param quietForMs - ask about work orders with no news for this long (FARM_RECONCILE_AFTER_S by default)
 */
export async function reconcileFarm(
  ctx: AppContext,
  runtime: FarmRuntime,
  quietForMs = runtime.env.FARM_RECONCILE_AFTER_S * 1000,
): Promise<ReconcileResult> {
  const cutoff = new Date(Date.now() - quietForMs);
  const quiet = await ctx.db
    .select()
    .from(farmDispatches)
    .where(
      and(
        eq(farmDispatches.status, 'at_farm'),
        isNotNull(farmDispatches.farmWorkOrderId),
        or(isNull(farmDispatches.farmChangedAt), lt(farmDispatches.farmChangedAt, cutoff)),
        or(isNull(farmDispatches.farmCheckedAt), lt(farmDispatches.farmCheckedAt, cutoff)),
      ),
    )
    .orderBy(asc(farmDispatches.farmCheckedAt))
    .limit(BATCH);
  let failed = 0;
  for (const row of quiet) {
    try {
      const workOrder = await runtime.client.getWorkOrder(row.farmWorkOrderId ?? '');
      await applyWorkOrder(ctx, workOrder, 'poll');
    } catch (err) {
      failed++;
      if (!(err instanceof FarmError)) throw err;
      // The farm is down or throttling: mark the row checked so the next round tries the others first.
      await ctx.db
        .update(farmDispatches)
        .set({ farmCheckedAt: new Date(), lastError: err.message })
        .where(eq(farmDispatches.id, row.id));
    }
  }
  const ordersMoved = await syncLaggingOrders(ctx);
  return { asked: quiet.length, failed, ordersMoved };
}
