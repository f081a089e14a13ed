/**
 * Starts print-farm fulfilment for a running server: the farm (fake or real), the hook that writes a dispatch row
 * when an order is paid, and the `farm.round` job (dispatch due rows, reconcile quiet work orders), asked for every
 * FARM_POLL_MS and right after each payment. boot() calls it after the server listens; closing the server stops it.
 */
import type { Server } from 'node:http';
import type { AppContext } from '../context';
import { installDispatchHook, wakeOnPayment } from './dispatchOrders';
import { FARM_ROUND_KEY, farmRoundJob } from './farmJobs';
import { startFarm, type FarmRuntime } from './farmRuntime';
import type { FarmEnv } from './farmEnv';

/**
 * Starts fulfilment for an app whose HTTP server listens at `serverUrl`.
 * @param ctx - app context
 * @param server - the HTTP server (its close stops the farm)
 * @param serverUrl - e.g. `http://localhost:3270`, where the fake farm sends its notices
 * @param env - farm settings (process.env by default)
 */
export async function startFulfilment(
  ctx: AppContext,
  server: Server,
  serverUrl: string,
  env?: FarmEnv,
): Promise<FarmRuntime> {
  const runtime = await startFarm(ctx, {
    serverUrl,
    env,
    work: async (c) => {
      await c.jobs.send(farmRoundJob, {}, { key: FARM_ROUND_KEY });
    },
  });
  // With JOBS_IN_API=false on PostgreSQL the workers run the rounds (they are in BACKGROUND_JOBS).
  if (ctx.jobs.kind === 'in-process' || ctx.env.JOBS_IN_API) await ctx.jobs.work([farmRoundJob]);
  installDispatchHook();
  const unhook = wakeOnPayment(runtime);
  runtime.nudge(); // rows queued before a restart go out now
  server.once('close', () => {
    unhook();
    void runtime.stop();
  });
  return runtime;
}
