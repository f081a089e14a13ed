/**
 * Shop API with the local payment fake: prices come from the server (tampering ignored), bad input names the
 * field, webhooks are verified with the SDK (bad signature 400, replay applied once, amount mismatch flagged),
 * a provider that is down gives 503 with nothing written, cancel refunds through the SDK, abandoned checkouts
 * expire, the customer's page opens only with its token, and the checkout limit holds across processes. Expected amounts are our own arithmetic from the settings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';
import { parse } from 'csv-parse/sync';
import supertest from 'supertest';
import { createApp } from '../server/app';
import { auditEvents, mailOutbox, orders, paymentEvents } from '../server/db/schema';
import { fakeClient, setPaymentRuntime, startPayments } from '../server/payments/paymentRuntime';
import { PaymentEnvSchema } from '../server/payments/paymentEnv';
import { expireAbandonedCheckouts } from '../server/services/checkoutService';
import { getRow } from '../server/services/orderQueries';
import { productMesh } from '../server/services/specSheetMesh';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import type { ShopProduct, ShopProductList } from '../shared/schemas/shop';
import { grossFromNet } from '../shared/shop/vat';
import {
  checkoutBody,
  newShopOrder,
  sessionEvent,
  SHOP_SKU,
  SHOP_SKU_2,
  startShopTest,
  type ShopTest,
} from './shopFixtures';
import { makeTestApp, useTestApp, TEST_ORIGIN } from './setup/testApp';

const t = useTestApp();
let shop: ShopTest;
beforeAll(async () => {
  shop = await startShopTest(t);
});
afterAll(async () => {
  await shop?.close();
});

async function countRows() {
  const [o] = await t.ctx.db.select({ n: count() }).from(orders);
  const [e] = await t.ctx.db.select({ n: count() }).from(paymentEvents);
  return { orders: o.n, events: e.n };
}

async function postEvent(event: object, signature?: string) {
  const payload = JSON.stringify(event);
  const header =
    signature ??
    shop.payments.client.webhooks.generateTestHeaderString({ payload, secret: shop.payments.webhookSecret });
  return (await t.agent(null))
    .post('/api/webhooks/payments')
    .set('Stripe-Signature', header)
    .set('Content-Type', 'application/json')
    .send(payload);
}

describe('shop catalogue', () => {
  it('lists only published families, priced with VAT from the catalogue price', async () => {
    const anon = await t.agent(null);
    const list = await anon.get('/api/shop/products');
    expect(list.status).toBe(200);
    expect(list.body.products.map((p: { slug: string }) => p.slug)).toEqual(['hedgerow-gable']);
    const product = await anon.get('/api/shop/products/hedgerow-gable');
    expect(product.status).toBe(200);
    const catalogue = await (await t.agent('sales')).get('/api/catalogue');
    const net = catalogue.body.variants.find((v: { sku: string }) => v.sku === SHOP_SKU).priceCents as number;
    const variant = product.body.variants.find((v: { sku: string }) => v.sku === SHOP_SKU);
    expect(variant.priceMinor).toBe(grossFromNet(net, 20));
    expect(variant.cautions.map((c: { title: string }) => c.title)).toEqual(
      expect.arrayContaining(['Heat', 'Perches']),
    );
    expect((await anon.get('/api/shop/products/copse-a-frame')).status).toBe(404);
    const filtered = await anon.get('/api/shop/products?colour=white');
    expect(filtered.body.products).toEqual([]);
  });
});

describe('shop product figures', () => {
  it('gives the size of the assembled box (its body, as the spec sheet draws it), not the print layout', async () => {
    const product = (await (await t.agent(null)).get('/api/shop/products/hedgerow-gable')).body as ShopProduct;
    const variant = product.variants.find((v) => v.sku === SHOP_SKU)!;
    const catalogue = await (await t.agent('sales')).get('/api/catalogue');
    const sold = (catalogue.body.variants as CatalogueVariant[]).find((v) => v.sku === SHOP_SKU)!;
    expect(variant.sizeKind).toBe('assembled');
    expect(variant.partCount).toBe(sold.report.partCount);
    // The body standing upright, measured from its own vertices (the spec sheet's drawing is checked against
    // admesh's bounding box in its own test).
    const body = await productMesh(sold.templateId, sold.params);
    const min = [Infinity, Infinity, Infinity];
    const max = [-Infinity, -Infinity, -Infinity];
    body.mesh.positions.forEach((value, i) => {
      min[i % 3] = Math.min(min[i % 3], value);
      max[i % 3] = Math.max(max[i % 3], value);
    });
    variant.sizeMm.forEach((mm, axis) => expect(mm).toBeCloseTo(max[axis] - min[axis], 1));
    if (sold.report.partCount > 1) expect(variant.sizeMm).not.toEqual(sold.report.bboxSizeMm);
  });

  it('shows house sparrows as a European species and cautions North American buyers of a 32 mm entry', async () => {
    // source: Passer domesticus, "House Sparrow" species account, Cornell Lab of Ornithology All About Birds (native
    // to Eurasia, introduced to North America in 1851); hole sizes: RSPB nest box guidance (32 mm for house sparrows)
    const product = (await (await t.agent(null)).get('/api/shop/products/hedgerow-gable')).body as ShopProduct;
    const wide = product.variants.find((v) => v.sku === SHOP_SKU_2)!;
    expect(wide.suits).toContainEqual({ name: 'House sparrow', region: 'europe' });
    expect(wide.suits.filter((b) => b.name === 'House sparrow').map((b) => b.region)).toEqual(['europe']);
    const caution = wide.regionCautions.find((c) => c.region === 'north-america');
    expect(caution?.text).toMatch(/house sparrows, introduced in North America/);
    expect(caution?.text).toMatch(/local rules/);
    const narrow = product.variants.find((v) => v.sku === SHOP_SKU)!;
    expect(narrow.regionCautions).toEqual([]);
    const list = (await (await t.agent(null)).get('/api/shop/products')).body as ShopProductList;
    expect(list.products[0].cautionRegions).toEqual(['north-america']);
  });
});

describe('checkout', () => {
  it('ignores any price or total in the body and prices the order on the server', async () => {
    const anon = await t.agent(null);
    const quote = await anon.post('/api/shop/quote').send({ country: 'GB', items: checkoutBody().items });
    expect(quote.status).toBe(200);
    const tampered = {
      ...checkoutBody(),
      totalMinor: 1,
      items: checkoutBody().items.map((item) => ({ ...item, unitPriceMinor: 1, priceCents: 1 })),
    };
    const res = await anon.post('/api/shop/checkout').send(tampered);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.checkoutUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/);
    const order = await (await t.agent('operations')).get(`/api/orders/${res.body.orderId}`);
    expect(order.body.totalMinor).toBe(quote.body.totalMinor);
    expect(order.body.totalMinor).toBe(quote.body.subtotalMinor + quote.body.shippingMinor);
    expect(order.body.lines.map((l: { sku: string; quantity: number }) => [l.sku, l.quantity])).toEqual([
      [SHOP_SKU, 2],
      [SHOP_SKU_2, 1],
    ]);
    const session = shop.payments.fake!.session(order.body.payment.sessionId);
    expect(session?.amount_total).toBe(quote.body.totalMinor);
    expect(session?.currency).toBe('eur');
  });

  it.each([
    ['an empty cart', { items: [] }, 'items', /cart is empty/],
    ['an unknown SKU', { items: [{ sku: 'FH-NOPE-1', quantity: 1 }] }, 'items.0.sku', /not on sale/],
    ['quantity 0', { items: [{ sku: SHOP_SKU, quantity: 0 }] }, 'items.0.quantity', /quantity/i],
    ['quantity 10,000', { items: [{ sku: SHOP_SKU, quantity: 10_000 }] }, 'items.0.quantity', /quantity/i],
    [
      'a malformed postcode',
      { shipTo: { ...checkoutBody().shipTo, postalCode: '<<>>' } },
      'shipTo.postalCode',
      /postcode/i,
    ],
    ['an unknown country', { shipTo: { ...checkoutBody().shipTo, country: 'XX' } }, 'shipTo.country', /country/i],
    ['no e-mail', { email: 'not-an-address' }, 'email', /e-mail/i],
  ])('answers 400 naming the field for %s, and writes nothing', async (_label, patch, path, message) => {
    const before = await countRows();
    const res = await (await t.agent(null)).post('/api/shop/checkout').send({ ...checkoutBody(), ...patch });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.details[0].path).toBe(path);
    expect(await countRows()).toEqual(before);
  });

  it('answers 400 for a SKU of a family that is not published (in review)', async () => {
    const res = await (
      await t.agent(null)
    )
      .post('/api/shop/checkout')
      .send({ ...checkoutBody(), items: [{ sku: 'FH-CAF-28-SAND', quantity: 1 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('items.0.sku');
  });

  it('pays through the fake: the signed webhook marks the order paid and queues the confirmation mail', async () => {
    const res = await (await t.agent(null)).post('/api/shop/checkout').send(checkoutBody('paid@example.test'));
    const row = await getRow(t.ctx.db, res.body.orderId);
    expect((await shop.payments.fake!.pay(row.paymentSessionId!, '4000 0000 0000 0002')).ok).toBe(false);
    expect((await getRow(t.ctx.db, row.id)).state).toBe('placed');
    expect((await shop.payments.fake!.pay(row.paymentSessionId!, '4242 4242 4242 4242')).ok).toBe(true);
    await shop.payments.fake!.settle();
    const paid = await getRow(t.ctx.db, row.id);
    expect(paid.state).toBe('paid');
    expect(paid.paidMinor).toBe(row.totalMinor);
    const mail = await t.ctx.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, `Order NW-${row.number} confirmed: thank you`));
    expect(mail[0]?.text).toContain(`/shop/orders/${row.customerToken}`);
    const page = await (await t.agent(null)).get(`/api/shop/orders/${row.customerToken}`);
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ state: 'paid', paid: true, number: `NW-${row.number}` });
    expect(page.body).not.toHaveProperty('email');
  });

  it('gives 404 for a guessed customer link', async () => {
    const res = await (await t.agent(null)).get(`/api/shop/orders/${'A'.repeat(43)}`);
    expect(res.status).toBe(404);
  });

  it('answers 503 with a message and writes nothing when the payment service is down', async () => {
    const before = await countRows();
    const working = shop.payments;
    setPaymentRuntime(t.ctx, { ...working, client: fakeClient(1) });
    try {
      const res = await (await t.agent(null)).post('/api/shop/checkout').send(checkoutBody());
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/could not reach the payment service/);
    } finally {
      setPaymentRuntime(t.ctx, working);
    }
    expect(await countRows()).toEqual(before);
  });
});

describe('payment webhooks', () => {
  it('refuses an unsigned or wrongly signed event with 400 and changes nothing', async () => {
    const orderId = await newShopOrder(t);
    const row = await getRow(t.ctx.db, orderId);
    const event = sessionEvent({
      ...shop.payments.fake!.session(row.paymentSessionId!),
      payment_status: 'paid',
      status: 'complete',
      payment_intent: 'pi_forged',
    });
    const before = await countRows();
    const unsigned = await (
      await t.agent(null)
    )
      .post('/api/webhooks/payments')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify(event));
    expect(unsigned.status).toBe(400);
    const wrongSecret = shop.payments.client.webhooks.generateTestHeaderString({
      payload: JSON.stringify(event),
      secret: 'whsec_wrong',
    });
    expect((await postEvent(event, wrongSecret)).status).toBe(400);
    expect(await countRows()).toEqual(before);
    expect((await getRow(t.ctx.db, orderId)).state).toBe('placed');
  });

  it('applies a replayed event once', async () => {
    const orderId = await newShopOrder(t);
    const row = await getRow(t.ctx.db, orderId);
    const event = sessionEvent({
      ...shop.payments.fake!.session(row.paymentSessionId!),
      payment_status: 'paid',
      status: 'complete',
      payment_intent: 'pi_replay',
    });
    const first = await postEvent(event);
    const second = await postEvent(event);
    expect([first.status, second.status]).toEqual([200, 200]);
    expect([first.body.applied, second.body.applied]).toEqual([true, false]);
    const paidAudits = await t.ctx.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.subject, `order:${orderId}`));
    expect(paidAudits.filter((a) => a.action === 'order.paid')).toHaveLength(1);
  });

  it('flags a payment whose amount differs from the total and does not fulfil the order', async () => {
    const orderId = await newShopOrder(t);
    const row = await getRow(t.ctx.db, orderId);
    const event = sessionEvent({
      ...shop.payments.fake!.session(row.paymentSessionId!),
      payment_status: 'paid',
      status: 'complete',
      payment_intent: 'pi_short',
      amount_total: row.totalMinor - 100,
    });
    expect((await postEvent(event)).body.outcome).toBe('flagged');
    const after = await getRow(t.ctx.db, orderId);
    expect(after.state).toBe('placed');
    expect(after.paymentFlag).toBe('amount_mismatch');
    const list = await (await t.agent('operations')).get('/api/orders?flagged=true');
    expect(list.body.orders.map((o: { id: string }) => o.id)).toContain(orderId);
  });
});

describe('operations', () => {
  it('cancels a paid order with a refund through the SDK, mails the customer, and refuses it twice (409)', async () => {
    const res = await (await t.agent(null)).post('/api/shop/checkout').send(checkoutBody('refund@example.test'));
    const row = await getRow(t.ctx.db, res.body.orderId);
    await shop.payments.fake!.pay(row.paymentSessionId!, '4242424242424242');
    await shop.payments.fake!.settle();
    const ops = await t.agent('operations');
    const cancelled = await ops.post(`/api/orders/${row.id}/cancel`).send({ reason: 'customer changed their mind' });
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200);
    expect(cancelled.body.state).toBe('refunded');
    expect(cancelled.body.payment.refundedMinor).toBe(row.totalMinor);
    expect(cancelled.body.payment.refundId).toMatch(/^re_/);
    const again = await ops.post(`/api/orders/${row.id}/cancel`).send({ reason: 'again' });
    expect(again.status).toBe(409);
    const mail = await t.ctx.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, `Order NW-${row.number} refunded`));
    expect(mail).toHaveLength(1);
  });

  it('moves a paid order along and refuses a jump the state does not allow (409)', async () => {
    const orderId = await newShopOrder(t, true);
    const admin = await t.agent('admin');
    expect(
      (
        await admin
          .post(`/api/orders/${orderId}/transition`)
          .send({ to: 'shipped', trackingUrl: 'https://carrier.test/1' })
      ).status,
    ).toBe(409);
    expect((await admin.post(`/api/orders/${orderId}/transition`).send({ to: 'in_production' })).status).toBe(200);
    expect((await admin.post(`/api/orders/${orderId}/transition`).send({ to: 'shipped' })).status).toBe(400);
    const shipped = await admin
      .post(`/api/orders/${orderId}/transition`)
      .send({ to: 'shipped', trackingUrl: 'https://carrier.test/1' });
    expect(shipped.body.state).toBe('shipped');
  });

  it('expires an abandoned checkout: the order is cancelled and its payment page closed', async () => {
    const orderId = await newShopOrder(t);
    await t.ctx.db
      .update(orders)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(orders.id, orderId));
    expect(await expireAbandonedCheckouts(t.ctx)).toBeGreaterThanOrEqual(1);
    const row = await getRow(t.ctx.db, orderId);
    expect(row.state).toBe('cancelled');
    expect(shop.payments.fake!.session(row.paymentSessionId!)?.status).toBe('expired');
  });

  it('exports orders as CSV with formula-like cells neutralised', async () => {
    const body = checkoutBody('csv@example.test');
    const { orderId } = await (
      await import('../server/services/checkoutService')
    ).startCheckout(
      t.ctx,
      { ...body, shipTo: { ...body.shipTo, name: '=HYPERLINK("http://x.test")' } },
      'http://nestwright.test',
    );
    const res = await (await t.agent('operations')).get('/api/orders/export.csv?q=csv%40example');
    expect(res.status).toBe(200);
    // source: csv-parse reads the file back as a spreadsheet would split it (reference library)
    const rows = parse(res.text, { columns: true }) as Array<Record<string, string>>;
    const mine = rows.filter((r) => r['E-mail'] === 'csv@example.test');
    expect(mine.length).toBeGreaterThan(0);
    expect(mine[0].Name).toBe(`'=HYPERLINK("http://x.test")`);
    expect(orderId).toBeTruthy();
  });
});

describe('payments at start-up', () => {
  it('starts the fake when no key is set, and refuses a key without a webhook secret', async () => {
    expect(() => PaymentEnvSchema.parse({ PAYMENT_SECRET_KEY: 'sk_test_abc' })).toThrow();
    const other = {};
    const runtime = await startPayments(other, { env: PaymentEnvSchema.parse({}) });
    expect(runtime.fake).not.toBeNull();
    await runtime.fake!.close();
  });
});

describe('checkout rate limit', () => {
  it('holds across two API processes sharing one database', async () => {
    const before = process.env.CHECKOUT_RATE_LIMIT;
    process.env.CHECKOUT_RATE_LIMIT = '3';
    const limited = await makeTestApp();
    try {
      // A second app on the same database stands for a second API process (its own limiter instance).
      const second = createApp(limited.ctx);
      const attempt = (app: typeof second) =>
        supertest(app).post('/api/shop/checkout').set('Origin', TEST_ORIGIN).send({ email: 'not an address' });
      // Every checkout request counts, even one refused for its content (common practice, no source).
      for (const app of [limited.app, second, limited.app]) expect((await attempt(app)).status).toBe(400);
      for (const app of [second, limited.app]) {
        const blocked = await attempt(app);
        expect(blocked.status).toBe(429);
        expect(blocked.body.error.code).toBe('too_many_checkouts');
      }
    } finally {
      if (before === undefined) delete process.env.CHECKOUT_RATE_LIMIT;
      else process.env.CHECKOUT_RATE_LIMIT = before;
      await limited.close();
    }
  });
});
