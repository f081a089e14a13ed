/**
 * Print-farm fulfilment through the real app and the fake farm at high speed: a paid order is dispatched through the
 * outbox and tracked to shipped; faults (farm down, lost notices, duplicate and badly signed notices, a failed
 * print, a rejected address) are handled without losing or doubling anything.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { desc, eq } from 'drizzle-orm';
import { auditEvents, farmDispatches, mailOutbox } from '../server/db/schema';
import { NOTICE_SIGNATURE_HEADER, NOTICE_TIMESTAMP_HEADER, signNotice } from '../server/farm/farmSignature';
import { FarmEnvSchema } from '../server/farm/farmEnv';
import type { FarmRuntime } from '../server/farm/farmRuntime';
import { startFulfilment } from '../server/farm/startFulfilment';
import { get as getOrder } from '../server/services/orderQueries';
import type { ShipTo } from '../shared/schemas/shop';
import type { OrderFulfilment } from '../shared/schemas/fulfilment';
import { useTestApp } from './setup/testApp';
import { payOneUnitOrder } from './setup/paidOrder';
import { listCatalogueVariants } from '../server/services/catalogue';
import { loadProductionCatalogue } from '../server/services/productionCatalogue';
import type { SalesSettings } from '../shared/schemas/sales';

const t = useTestApp();
let server: Server;
let farm: FarmRuntime;
let baseUrl: string;

const ADDRESS: ShipTo = {
  name: 'Rosa Finch',
  line1: '7 Beech Row',
  line2: '',
  city: 'Lowmoor',
  region: '',
  postalCode: 'LM2 5TT',
  country: 'GB',
};

beforeAll(async () => {
  server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  farm = await startFulfilment(
    t.ctx,
    server,
    baseUrl,
    FarmEnvSchema.parse({
      FARM_FAKE_SPEED: '40000',
      FARM_POLL_MS: '100',
      FARM_RETRY_BASE_MS: '50',
      FARM_RECONCILE_AFTER_S: '1',
    }),
  );
}, 60_000);

afterAll(async () => {
  await new Promise((resolve) => {
    server.close(resolve);
    server.closeAllConnections();
  });
  await t.ctx.jobs.stop();
});

/** A paid order of one unit of a published variant, through the order service (as the payment webhook does it). */
async function paidOrder(shipTo: ShipTo = ADDRESS): Promise<string> {
  const order = await payOneUnitOrder(t.ctx, { shipTo, email: 'rosa.finch@example.test', siteOrigin: baseUrl });
  expect(order.outcome).toBe('paid');
  return order.id;
}

async function until<T>(read: () => Promise<T | undefined | false>, what: string, limitMs = 45_000): Promise<T> {
  const stop = Date.now() + limitMs;
  for (;;) {
    const value = await read();
    if (value) return value;
    if (Date.now() > stop) throw new Error(`gave up waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

async function orderDetail(id: string): Promise<{
  state: string;
  history: Array<{ action: string; details: Record<string, unknown> }>;
  fulfilment: OrderFulfilment;
}> {
  return getOrder(t.ctx.db, id);
}

const shipped = (id: string) =>
  until(async () => {
    const order = await orderDetail(id);
    return order.state === 'shipped' ? order : undefined;
  }, `order ${id} shipped`);

describe('dispatch and tracking', () => {
  it('writes the dispatch row with the payment, sends it once and tracks the order to shipped with the mail', async () => {
    const id = await paidOrder();
    const order = await shipped(id);
    const [dispatch] = order.fulfilment.dispatches;
    expect(dispatch.status).toBe('done');
    expect(dispatch.carrier).toBeTruthy();
    expect(dispatch.trackingCode).toMatch(/^[A-Z]{2}\d{12}$/);
    const actions = order.history.map((h) => h.action);
    expect(actions).toEqual(
      expect.arrayContaining(['order.paid', 'farm.dispatched', 'order.in_production', 'order.shipped']),
    );
    expect(actions.indexOf('order.paid')).toBeLessThan(actions.indexOf('farm.dispatched'));
    const stages = order.history.filter((h) => h.action === 'farm.stage').map((h) => h.details.stage);
    expect(stages).toContain('handed_over');
    expect(order.history.find((h) => h.action === 'farm.dispatched')?.details.farmWorkOrderId).toBe(
      dispatch.farmWorkOrderId,
    );
    const mails = await t.ctx.db.select().from(mailOutbox).orderBy(desc(mailOutbox.id));
    expect(mails.some((m) => m.text.includes(dispatch.trackingUrl!))).toBe(true);
    const atFarm = await fetch(`${farm.fake!.url}/v1/work-orders`, {
      headers: { authorization: 'Bearer fake-farm-key' },
    });
    const listed = (await atFarm.json()) as { workOrders: Array<{ id: string }> };
    expect(listed.workOrders.filter((w) => w.id === dispatch.farmWorkOrderId)).toHaveLength(1);
  });

  it('keeps an order waiting for a farm that is down, shows the last error, and sends it when the farm is back', async () => {
    farm.fake!.floor.faults.down = true;
    const id = await paidOrder();
    const waiting = await until(async () => {
      const [row] = await t.ctx.db.select().from(farmDispatches).where(eq(farmDispatches.orderId, id));
      return row?.status === 'waiting' && row.failures >= 2 ? row : undefined;
    }, 'waiting with retries');
    expect(waiting.lastError).toMatch(/503|down/);
    const queue = await (await t.agent('operations')).get('/api/farm/exceptions');
    expect(queue.body.waiting.map((w: { orderId: string }) => w.orderId)).toContain(id);
    farm.fake!.floor.faults.down = false;
    const order = await shipped(id);
    expect(order.history.map((h) => h.action)).toEqual(expect.arrayContaining(['farm.waiting', 'farm.dispatched']));
    expect(order.fulfilment.dispatches).toHaveLength(1);
  });

  it('heals lost notices by reconciliation', async () => {
    farm.fake!.floor.faults.loseNotices = 1000;
    const id = await paidOrder();
    const order = await shipped(id);
    farm.fake!.floor.faults.loseNotices = 0;
    expect(order.history.some((h) => h.action === 'farm.stage' && h.details.via === 'poll')).toBe(true);
  });

  it('records a failed print and its reprint, and counts it in the cost', async () => {
    farm.fake!.floor.faults.failPrints = 1;
    const id = await paidOrder();
    const order = await shipped(id);
    expect(order.fulfilment.reprints).toBe(1);
    expect(order.fulfilment.reprintCostMinor).toBeGreaterThan(0);
    expect(order.history.some((h) => h.action === 'farm.reprint')).toBe(true);
  });

  it('takes a rejected address through the exceptions queue: fixed, sent again, shipped', async () => {
    farm.fake!.floor.faults.rejectAddressesMatching = 'NOWHERE';
    const id = await paidOrder({ ...ADDRESS, postalCode: 'NOWHERE 9' });
    const ops = await t.agent('operations');
    const held = await until(async () => {
      const res = await ops.get('/api/farm/exceptions');
      return (res.body.held as Array<{ id: number; orderId: string; holdCode: string }>).find((h) => h.orderId === id);
    }, 'held dispatch');
    expect(held.holdCode).toBe('address_undeliverable');
    const fix = await ops
      .post(`/api/farm/dispatches/${held.id}/redispatch`)
      .send({ shipTo: { ...ADDRESS, postalCode: 'LM2 5TU' }, note: 'customer confirmed the postcode' });
    expect(fix.status).toBe(201);
    expect(fix.body.attempt).toBe(2);
    const again = await ops.post(`/api/farm/dispatches/${held.id}/redispatch`).send({});
    expect(again.status).toBe(409);
    farm.fake!.floor.faults.rejectAddressesMatching = null;
    const order = await shipped(id);
    expect(order.fulfilment.dispatches.map((d) => d.status)).toEqual(['done', 'withdrawn']);
    expect(order.history.map((h) => h.action)).toEqual(
      expect.arrayContaining(['farm.held', 'order.address_corrected', 'farm.redispatched']),
    );
  });

  it('answers a bad redispatch body with a message naming the field', async () => {
    const ops = await t.agent('operations');
    const res = await ops.post('/api/farm/dispatches/999999/redispatch').send({ shipTo: { name: '' } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('Enter the name to ship to.');
  });
});

describe('notice endpoint', () => {
  async function latestWorkOrder() {
    const [row] = await t.ctx.db
      .select()
      .from(farmDispatches)
      .where(eq(farmDispatches.status, 'done'))
      .orderBy(desc(farmDispatches.id))
      .limit(1);
    return farm.client.getWorkOrder(row.farmWorkOrderId!);
  }

  function post(body: string, headers: Record<string, string>) {
    return fetch(`${baseUrl}/api/webhooks/farm`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...headers },
      body,
    });
  }

  it('applies a notice once: a repeat answers 200 and changes nothing', async () => {
    const workOrder = await latestWorkOrder();
    const body = JSON.stringify({
      noticeId: `nt_test_${randomBytes(4).toString('hex')}`,
      kind: 'stage_changed',
      occurredAt: new Date().toISOString(),
      workOrder,
    });
    const now = Math.floor(Date.now() / 1000);
    const headers = {
      [NOTICE_TIMESTAMP_HEADER]: String(now),
      [NOTICE_SIGNATURE_HEADER]: signNotice(farm.noticeSecret, now, body),
    };
    const before = await t.ctx.db.select().from(auditEvents);
    const first = await post(body, headers);
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ duplicate: false, applied: true });
    const second = await post(body, headers);
    expect(second.status).toBe(200);
    expect(await second.json()).toMatchObject({ duplicate: true });
    const after = await t.ctx.db.select().from(auditEvents);
    expect(after.length).toBe(before.length);
  });

  it('answers 400 to a wrong signature, a stale timestamp and a missing signature, and stores nothing', async () => {
    const workOrder = await latestWorkOrder();
    const body = JSON.stringify({ noticeId: 'nt_forged', kind: 'stage_changed', occurredAt: '', workOrder });
    const now = Math.floor(Date.now() / 1000);
    const forged = await post(body, {
      [NOTICE_TIMESTAMP_HEADER]: String(now),
      [NOTICE_SIGNATURE_HEADER]: signNotice('not-the-secret-at-all', now, body),
    });
    expect(forged.status).toBe(400);
    const stale = await post(body, {
      [NOTICE_TIMESTAMP_HEADER]: String(now - 3600),
      [NOTICE_SIGNATURE_HEADER]: signNotice(farm.noticeSecret, now - 3600, body),
    });
    expect(stale.status).toBe(400);
    expect((await post(body, { [NOTICE_TIMESTAMP_HEADER]: String(now) })).status).toBe(400);
  });
});

describe('planned runs', () => {
  it('delivers a run to the workshop address saved in the sales settings', async () => {
    const admin = await t.agent('admin');
    const { settings } = (await admin.get('/api/settings/sales')).body as { settings: SalesSettings };
    const workshop = { ...settings.workshopAddress, line1: '4 Kiln Lane', postalCode: 'LM9 1KL' };
    expect((await admin.put('/api/settings/sales').send({ ...settings, workshopAddress: workshop })).status).toBe(200);
    const [variant] = await listCatalogueVariants(t.ctx, {});
    const printers = (await loadProductionCatalogue(t.ctx.db)).printers;
    const sent = await (await t.agent('operations')).post('/api/farm/runs').send({
      items: [{ sku: variant.sku, quantity: 3 }],
      printerId: printers[0].id,
      startDate: '2099-03-02',
      finishBy: '2099-03-20',
    });
    expect(sent.status).toBe(201);
    const workOrderId = await until(async () => {
      const [row] = await t.ctx.db.select().from(farmDispatches).where(eq(farmDispatches.runId, sent.body.id));
      // Wait until the farm has handed it over, so no notice of it arrives during a later test.
      return row?.status === 'done' ? row.farmWorkOrderId! : undefined;
    }, 'the run handed over by the farm');
    const workOrder = await farm.client.getWorkOrder(workOrderId);
    expect(workOrder.shipTo).toMatchObject({ line1: '4 Kiln Lane', postalCode: 'LM9 1KL', city: workshop.city });
  });
});
