/**
 * Jobs in a process that did not start the payment and farm services (a `npm run worker` process): checkout expiry
 * and farm dispatch reach the fakes an API process started, through the addresses it advertised in the database.
 * A second app context on the same database stands for the worker process (its own job queue, no services).
 * These are our own product rules (common practice, no source).
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createContext, type AppContext } from '../server/context';
import { farmDispatches, orders, serviceEndpoints } from '../server/db/schema';
import { installDispatchHook } from '../server/farm/dispatchOrders';
import { FarmEnvSchema } from '../server/farm/farmEnv';
import { farmRoundJob } from '../server/farm/farmJobs';
import { startFarm, stopFarm, type FarmRuntime } from '../server/farm/farmRuntime';
import type { JobRun } from '../server/jobs/JobQueue';
import { expireCheckoutsJob } from '../server/payments/expireCheckoutsJob';
import { hasPayments, paymentsOf, stopPayments } from '../server/payments/paymentRuntime';
import { getRow } from '../server/services/orderQueries';
import { startShopServices } from '../server/services/shopServices';
import { checkoutBody, newShopOrder, sellableSkus } from './shopFixtures';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
let server: Server;
let farm: FarmRuntime;
let worker: AppContext;

/** What a job handler receives when the worker's queue runs it. */
function runOn(ctx: AppContext): JobRun {
  return { ctx, signal: new AbortController().signal, attempt: 1, jobId: crypto.randomUUID() };
}

beforeAll(async () => {
  server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  // The API process: the payment fake and the fake farm; its own farm rounds are left to the worker.
  await startShopServices(t.ctx, server);
  farm = await startFarm(t.ctx, {
    serverUrl: baseUrl,
    env: FarmEnvSchema.parse({ FARM_FAKE_SPEED: '40000', FARM_POLL_MS: '600000' }),
    work: async () => {},
  });
  worker = createContext({ db: t.ctx.db, pg: t.ctx.pg, env: t.ctx.env, log: () => {} });
}, 60_000);

afterAll(async () => {
  await stopFarm(t.ctx);
  await stopPayments(t.ctx);
  await new Promise((resolve) => {
    server.close(resolve);
    server.closeAllConnections();
  });
  await worker?.jobs.stop();
});

describe('jobs in a worker process', () => {
  it('finds the addresses of the fakes the API process started', async () => {
    const rows = await t.ctx.db.select().from(serviceEndpoints);
    expect(Object.fromEntries(rows.map((row) => [row.name, row.url]))).toEqual({
      'payments-fake': `http://127.0.0.1:${paymentsOf(t.ctx).fake!.port}`,
      'farm-fake': farm.fake!.url,
    });
  });

  it('expires an abandoned checkout through the payment fake of the API process', async () => {
    const res = await (
      await t.agent(null)
    )
      .post('/api/shop/checkout')
      .send(checkoutBody('late@example.test', await sellableSkus(t)));
    expect(res.status).toBe(201);
    const orderId = res.body.orderId as string;
    await t.ctx.db
      .update(orders)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(orders.id, orderId));
    expect(hasPayments(worker)).toBe(false);

    await expireCheckoutsJob.handler({}, runOn(worker));

    const row = await getRow(t.ctx.db, orderId);
    expect(row.state).toBe('cancelled');
    // The session was closed at the provider (the fake the API process runs), so a late payment cannot land.
    const session = await paymentsOf(t.ctx).client.checkout.sessions.retrieve(row.paymentSessionId!);
    expect(session.status).toBe('expired');
  });

  it('sends a paid order to the fake farm of the API process', async () => {
    installDispatchHook();
    const orderId = await newShopOrder(t, true);
    const [queued] = await t.ctx.db.select().from(farmDispatches).where(eq(farmDispatches.orderId, orderId));
    expect(queued.status).toBe('queued');

    await farmRoundJob.handler({}, runOn(worker));

    const [sent] = await t.ctx.db.select().from(farmDispatches).where(eq(farmDispatches.orderId, orderId));
    expect(sent.farmWorkOrderId).toBeTruthy();
    const atFarm = await fetch(`${farm.fake!.url}/v1/work-orders`, {
      headers: { authorization: 'Bearer fake-farm-key' },
    });
    const listed = (await atFarm.json()) as { workOrders: Array<{ id: string }> };
    expect(listed.workOrders.map((w) => w.id)).toContain(sent.farmWorkOrderId);
  });
});
