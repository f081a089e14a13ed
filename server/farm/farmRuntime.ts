/**
 * The print farm of one running app: our client, the fake farm when FARM_API_URL is unset, the notice secret, and
 * the timer that asks the job queue to dispatch and reconcile. boot() starts it after the server listens.
 */
import { randomBytes } from 'node:crypto';
import type { AppContext } from '../context';
import { FakeFarm } from './FakeFarm';
import { FarmClient } from './FarmClient';
import { loadFarmEnv, type FarmEnv } from './farmEnv';
import { advertiseEndpoint, findEndpoint } from '../services/serviceEndpoints';

/** The farm parts running for one app context. */
export interface FarmRuntime {
  client: FarmClient;
  /** The fake farm, when the app runs its own. */
  fake: FakeFarm | null;
  /** Secret the farm signs notices with. */
  noticeSecret: string;
  env: FarmEnv;
  /** Wakes the dispatcher now (after a payment or a re-dispatch). */
  nudge(): void;
  stop(): Promise<void>;
}

const runtimes = new WeakMap<object, FarmRuntime>();

/** The farm of an app, if this process started it. @param ctx - the app context */
export function farmRuntime(ctx: object): FarmRuntime | undefined {
  return runtimes.get(ctx);
}

/** Options of {@link startFarm}. */
export interface StartFarmOptions {
  /** Farm settings (process.env by default). */
  env?: FarmEnv;
  /** Our server's own address, for the fake farm's notices. */
  serverUrl: string;
  /** What the timer runs: dispatch due rows, then reconcile quiet work orders. */
  work: (ctx: AppContext, runtime: FarmRuntime) => Promise<void>;
}

/**
 * Starts the farm of an app: the fake farm (unless FARM_API_URL points at a real one), our client, and a timer that
 * runs `work` every FARM_POLL_MS (and at once when nudged); one round at a time.
 * @param ctx - the app context
 * @param options - settings, our address and the work to run
 */
export async function startFarm(ctx: AppContext, options: StartFarmOptions): Promise<FarmRuntime> {
  const env = options.env ?? loadFarmEnv();
  const noticeSecret = env.FARM_NOTICE_SECRET ?? randomBytes(24).toString('hex');
  let fake: FakeFarm | null = null;
  let baseUrl = env.FARM_API_URL;
  if (!baseUrl) {
    fake = new FakeFarm({
      apiKey: env.FARM_API_KEY,
      noticeSecret,
      speed: env.FARM_FAKE_SPEED,
      noticeUrl: `${options.serverUrl}/api/webhooks/farm`,
    });
    baseUrl = await fake.listen(env.FARM_FAKE_PORT);
    // Worker processes on this machine send to this fake too (see farmForJob).
    await advertiseEndpoint(ctx.db, 'farm-fake', baseUrl);
  }
  const client = new FarmClient({ baseUrl, apiKey: env.FARM_API_KEY });

  let running: Promise<void> | undefined;
  let again = false;
  let stopped = false;
  const round = (): void => {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    running = options
      .work(ctx, runtime)
      .catch((err: unknown) => ctx.log(`farm: ${err instanceof Error ? err.message : String(err)}`))
      .finally(() => {
        running = undefined;
        if (again && !stopped) {
          again = false;
          round();
        }
      });
  };
  const timer = setInterval(round, env.FARM_POLL_MS);
  timer.unref();

  const runtime: FarmRuntime = {
    client,
    fake,
    noticeSecret,
    env,
    nudge: () => setTimeout(round, 20).unref(),
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running;
      await fake?.close();
      runtimes.delete(ctx);
    },
  };
  runtimes.set(ctx, runtime);
  ctx.log(`  farm: ${fake ? `fake farm on ${baseUrl} at ${env.FARM_FAKE_SPEED}× speed` : `sending to ${baseUrl}`}`);
  return runtime;
}

/**
 * The farm a job should use in this process: the one this process started, or else (a worker) a client of the farm
 * in the settings (FARM_API_URL) or of the fake farm an API process on this machine advertised. Undefined when no
 * farm is known yet. A worker's runtime has no timer and no fake; `nudge` does nothing (the API process that
 * receives payments asks for rounds).
 * @param ctx - the app context
 */
export async function farmForJob(ctx: AppContext): Promise<FarmRuntime | undefined> {
  const own = runtimes.get(ctx);
  if (own) return own;
  const env = loadFarmEnv();
  // Looked up every time: an API process that restarts starts its fake on a new port.
  const baseUrl = env.FARM_API_URL ?? (await findEndpoint(ctx.db, 'farm-fake'));
  if (!baseUrl) return undefined;
  return {
    client: new FarmClient({ baseUrl, apiKey: env.FARM_API_KEY }),
    fake: null,
    noticeSecret: env.FARM_NOTICE_SECRET ?? '',
    env,
    nudge: () => {},
    stop: async () => {},
  };
}

/** Stops the farm of an app. @param ctx - the app context */
export async function stopFarm(ctx: AppContext): Promise<void> {
  await runtimes.get(ctx)?.stop();
}
