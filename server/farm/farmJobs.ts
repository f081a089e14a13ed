/**
 * The farm's background work on the job queue: one `farm.round` job sends due dispatch rows and, now and then,
 * reconciles quiet work orders. The outbox rows in the database are the state; the job only runs the work, so a
 * job lost in a restart costs nothing (the next round finds the rows). A process without a farm (no runtime) skips.
 */
import { z } from 'zod';
import type { AppContext } from '../context';
import { defineJob } from '../jobs/JobQueue';
import { dispatchDue } from './dispatchOrders';
import { farmRuntime, type FarmRuntime } from './farmRuntime';
import { reconcileFarm } from './reconcileFarm';

const lastReconcile = new WeakMap<object, number>();

/**
 * One round of farm work: send what is due, then (at most every FARM_RECONCILE_AFTER_S / 4) ask the farm about
 * quiet work orders.
 * @param ctx - app context
 * @param runtime - the farm
 */
export async function farmRound(ctx: AppContext, runtime: FarmRuntime): Promise<void> {
  await dispatchDue(ctx, runtime);
  const everyMs = (runtime.env.FARM_RECONCILE_AFTER_S * 1000) / 4;
  if (Date.now() - (lastReconcile.get(ctx) ?? 0) >= everyMs) {
    lastReconcile.set(ctx, Date.now());
    await reconcileFarm(ctx, runtime);
  }
}

/** Idempotency key of the round: while one waits, asking for another queues nothing. */
export const FARM_ROUND_KEY = 'farm-round';

/** `farm.round`: dispatch and reconcile in the process that runs the farm. */
export const farmRoundJob = defineJob({
  name: 'farm.round',
  title: 'Sending paid orders to the print farm and checking on them',
  data: z.object({}),
  retry: { limit: 2, delaySec: 5, backoff: true },
  timeLimitSec: 600,
  concurrency: 1,
  everySec: 30,
  async handler(_data, { ctx }) {
    const runtime = farmRuntime(ctx);
    if (runtime) await farmRound(ctx, runtime);
  },
});
