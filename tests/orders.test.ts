/**
 * The order service: created from a checkout, paid by the provider's report (or flagged when the amount differs),
 * guarded transitions with audit, hooks inside the transaction, customer mail queued with the state change.
 * State rules are our own product decision (no outside source).
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import type { ShopQuote } from '../shared/schemas/shop';
import { mailOutbox } from '../server/db/schema';
import { HttpError } from '../server/http/HttpError';
import { onOrderTransition } from '../server/services/orderHooks';
import { clearPaymentFlag, createFromCheckout, markPaid } from '../server/services/orderService';
import { get, getForCustomer, list } from '../server/services/orderQueries';
import { transition } from '../server/services/orderTransitions';
import { useTestApp } from './setup/testApp';

const QUOTE: ShopQuote = {
  currency: 'EUR',
  lines: [
    {
      sku: 'FH-TEST-1',
      productName: 'Test box, sand',
      quantity: 2,
      unitPriceMinor: 3480,
      lineTotalMinor: 6960,
      meshSha256: 'a'.repeat(64),
      billableKg: 1,
    },
  ],
  subtotalMinor: 6960,
  shippingMinor: 595,
  vatMinor: 1259,
  vatRatePct: 20,
  totalMinor: 7555,
  billableKg: 2,
  shippingZone: 'home',
};

const t = useTestApp();

async function newOrder(email = 'robin@example.test') {
  return createFromCheckout(t.ctx.db, {
    id: randomUUID(),
    customerToken: randomUUID().replace(/-/g, '') + randomUUID().replace(/-/g, ''),
    email,
    shipTo: {
      name: 'Robin Test',
      line1: '1 Lane',
      line2: '',
      city: 'Town',
      region: '',
      postalCode: 'AB1 2CD',
      country: 'GB',
    },
    quote: QUOTE,
    paymentSessionId: `cs_test_${randomUUID()}`,
    expiresAt: new Date(Date.now() + 3600_000),
    siteOrigin: 'http://shop.test',
  });
}

describe('order service', () => {
  it('creates a placed order with a human number, lines and an audit entry', async () => {
    const order = await newOrder();
    expect(order.state).toBe('placed');
    expect(order.number).toMatch(/^NW-\d{4,}$/);
    expect(order.lines).toEqual([expect.objectContaining({ sku: 'FH-TEST-1', quantity: 2, unitPriceMinor: 3480 })]);
    const detail = await get(t.ctx.db, order.id);
    expect(detail.history.map((h) => h.action)).toEqual(['order.placed']);
  });

  it('marks paid when the amount matches, runs hooks in the transaction and queues the confirmation', async () => {
    const order = await newOrder('paid@example.test');
    const seen: string[] = [];
    const off = onOrderTransition(({ order: row, to }) => {
      seen.push(`${row.id}:${to}`);
    });
    try {
      const outcome = await markPaid(t.ctx.db, order.id, {
        paymentIntentId: 'pi_1',
        amountMinor: 7555,
        currency: 'eur',
        eventId: 'evt_1',
      });
      expect(outcome).toBe('paid');
      expect(seen).toEqual([`${order.id}:paid`]);
      expect(
        await markPaid(t.ctx.db, order.id, {
          paymentIntentId: 'pi_1',
          amountMinor: 7555,
          currency: 'eur',
          eventId: 'evt_1',
        }),
      ).toBe('already_paid');
    } finally {
      off();
    }
    const mail = await t.ctx.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, `Order ${order.number} confirmed: thank you`));
    expect(mail).toHaveLength(1);
    expect(mail[0].to).toEqual(['paid@example.test']);
    expect(mail[0].text).toMatch(/http:\/\/shop\.test\/shop\/orders\/[A-Za-z0-9]{64}/);
  });

  it('flags a payment whose amount differs and does not fulfil it', async () => {
    const order = await newOrder();
    const outcome = await markPaid(t.ctx.db, order.id, {
      paymentIntentId: 'pi_2',
      amountMinor: 100,
      currency: 'EUR',
      eventId: 'evt_2',
    });
    expect(outcome).toBe('flagged');
    const detail = await get(t.ctx.db, order.id);
    expect(detail.state).toBe('placed');
    expect(detail.payment.flag).toBe('amount_mismatch');
    expect(detail.history.at(-1)?.action).toBe('order.payment_flagged');
    expect((await list(t.ctx.db, { flagged: 'true', page: 1, pageSize: 50 })).orders.map((o) => o.id)).toContain(
      order.id,
    );
  });

  it('clears a checked payment flag through the API: paid, audited with the note, confirmation queued', async () => {
    const order = await newOrder('flagged@example.test');
    expect(
      await markPaid(t.ctx.db, order.id, {
        paymentIntentId: 'pi_f',
        amountMinor: 7000,
        currency: 'EUR',
        eventId: 'evt_f',
      }),
    ).toBe('flagged');
    const ops = await t.agent('operations');
    const noNote = await ops.post(`/api/orders/${order.id}/clear-flag`).send({ note: ' ' });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.message).toMatch(/what you checked/);
    const res = await ops
      .post(`/api/orders/${order.id}/clear-flag`)
      .send({ note: 'The customer paid the 5.55 difference by bank transfer.' });
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('paid');
    const detail = await get(t.ctx.db, order.id);
    expect(detail.payment.flag).toBeNull();
    expect(detail.history.map((h) => h.action).slice(-2)).toEqual(['order.flag_cleared', 'order.paid']);
    expect(detail.history.at(-2)?.details).toMatchObject({
      flag: 'amount_mismatch',
      paidMinor: 7000,
      expectedMinor: 7555,
    });
    const mail = await t.ctx.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, `Order ${order.number} confirmed: thank you`));
    expect(mail).toHaveLength(1);
    // Once cleared there is nothing left to clear.
    await expect(clearPaymentFlag(t.ctx.db, order.id, null, 'again')).rejects.toMatchObject({ status: 409 });
    const unflagged = await newOrder();
    await expect(clearPaymentFlag(t.ctx.db, unflagged.id, null, 'nothing to clear')).rejects.toMatchObject({
      status: 409,
    });
  });

  it('refuses transitions the state does not allow with 409 and audits the allowed ones', async () => {
    const order = await newOrder();
    await expect(transition(t.ctx.db, order.id, 'shipped', null)).rejects.toMatchObject({ status: 409 });
    await markPaid(t.ctx.db, order.id, {
      paymentIntentId: 'pi_3',
      amountMinor: 7555,
      currency: 'EUR',
      eventId: 'evt_3',
    });
    await transition(t.ctx.db, order.id, 'in_production', null);
    const shipped = await transition(t.ctx.db, order.id, 'shipped', null, { trackingUrl: 'https://carrier.test/t/1' });
    expect(shipped.trackingUrl).toBe('https://carrier.test/t/1');
    await transition(t.ctx.db, order.id, 'delivered', null);
    const refunded = await transition(t.ctx.db, order.id, 'refunded', null, { refundId: 're_1', refundedMinor: 7555 });
    expect(refunded.state).toBe('refunded');
    const err = await transition(t.ctx.db, order.id, 'paid', null).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(409);
    const detail = await get(t.ctx.db, order.id);
    expect(detail.history.map((h) => h.action)).toEqual([
      'order.placed',
      'order.paid',
      'order.in_production',
      'order.shipped',
      'order.delivered',
      'order.refunded',
    ]);
    const subjects = (await t.ctx.db.select().from(mailOutbox)).map((m) => m.subject);
    expect(subjects).toContain(`Order ${order.number} is on its way`);
    expect(subjects).toContain(`Order ${order.number} refunded`);
  });

  it('a hook that throws rolls the transition back', async () => {
    const order = await newOrder();
    const off = onOrderTransition(() => {
      throw new Error('dispatch outbox unavailable');
    });
    try {
      await expect(
        markPaid(t.ctx.db, order.id, { paymentIntentId: 'pi_4', amountMinor: 7555, currency: 'EUR', eventId: 'evt_4' }),
      ).rejects.toThrow('dispatch outbox unavailable');
    } finally {
      off();
    }
    expect((await get(t.ctx.db, order.id)).state).toBe('placed');
  });

  it('searches by number, e-mail and SKU, and finds the customer view only by token', async () => {
    const order = await newOrder('finch@example.test');
    expect((await list(t.ctx.db, { q: order.number, page: 1, pageSize: 10 })).orders.map((o) => o.id)).toEqual([
      order.id,
    ]);
    expect((await list(t.ctx.db, { q: 'FINCH@', page: 1, pageSize: 10 })).orders.map((o) => o.id)).toEqual([order.id]);
    expect((await list(t.ctx.db, { q: 'fh-test', page: 1, pageSize: 2 })).orders).toHaveLength(2);
    await expect(getForCustomer(t.ctx.db, 'x'.repeat(64))).rejects.toMatchObject({ status: 404 });
  });
});
