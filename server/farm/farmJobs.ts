/**
 * The farm's background work on the job queue: one `farm.round` job sends due dispatch rows and, now and then,
 * reconciles quiet work orders. The outbox rows in the database are the state; the job only runs the work, so a
 * job lost in a restart costs nothing (the next round finds the rows). A worker process reaches the farm from the
 * settings or the fake an API process advertised (`farmForJob`); with no farm known yet, a single process skips and
 * a worker fails the attempt (retried, then shown to admins as a failed job).
 */
import { z } from 'zod';
import type { AppContext } from '../context';
import { defineJob } from '../jobs/JobQueue';
import { dispatchDue } from './dispatchOrders';
import { farmForJob, type FarmRuntime } from './farmRuntime';
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

/** `farm.round`: dispatch and reconcile, in whichever process runs jobs (an API process or a worker). */
export const farmRoundJob = defineJob({
  name: 'farm.round',
  title: 'Sending paid orders to the print farm and checking on them',
  data: z.object({}),
  retry: { limit: 2, delaySec: 5, backoff: true },
  timeLimitSec: 600,
  concurrency: 1,
  everySec: 30,
  async handler(_data, { ctx }) {
    const runtime = await farmForJob(ctx);
    if (runtime) await farmRound(ctx, runtime);
    else if (ctx.jobs.kind !== 'in-process')
      throw new Error(
        'no print farm is known yet: set FARM_API_URL, or start an API process (it starts the fake farm)',
      );
  },
});
