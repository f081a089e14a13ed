/**
 * Contract of the local payment fake: the official SDK's calls (create, retrieve and expire a checkout session,
 * create a refund) get answers with the fields and types the SDK's own type declarations describe; test cards act
 * as the provider documents; events are signed so that the SDK's constructEvent verifies them; a webhook that got
 * a non-2xx answer is retried (with exponential backoff) until it gets a 2xx.
 * source: the SDK's types (stripe 23, Checkout.Session, Refund, Event) are the reference.
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FakePaymentProvider } from '../server/payments/FakePaymentProvider';
import { fakeClient } from '../server/payments/paymentRuntime';
import { luhnValid, testCardOutcome } from '../server/payments/testCards';

const SECRET = 'whsec_contract_test';
let receiver: Server;
let receiverUrl = '';
const received: Array<{ body: string; signature: string; at: number }> = [];
let failFirst = 0;
let fake: FakePaymentProvider;
let client: Stripe;

beforeAll(async () => {
  receiver = createServer((req, res) => {
    let body = '';
    req.on('data', (c: Buffer) => (body += c.toString('utf8')));
    req.on('end', () => {
      received.push({ body, signature: String(req.headers['stripe-signature']), at: Date.now() });
      if (failFirst > 0) {
        failFirst -= 1;
        res.writeHead(500).end();
      } else res.writeHead(200).end('{}');
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/hook`;
  fake = new FakePaymentProvider({
    webhookSecret: SECRET,
    webhookUrl: () => receiverUrl,
    retryBaseMs: 40,
    retryMaxMs: 400,
    maxAttempts: 4,
  });
  client = fakeClient(await fake.listen(0));
});
afterAll(async () => {
  await fake?.close();
  await new Promise<void>((resolve) => receiver.close(() => resolve()));
});

async function newSession(): Promise<Stripe.Checkout.Session> {
  return client.checkout.sessions.create({
    mode: 'payment',
    line_items: [
      { quantity: 2, price_data: { currency: 'eur', unit_amount: 3480, product_data: { name: 'Box' } } },
      { quantity: 1, price_data: { currency: 'eur', unit_amount: 595, product_data: { name: 'Shipping' } } },
    ],
    customer_email: 'c@example.test',
    client_reference_id: 'order-1',
    metadata: { orderId: 'order-1' },
    success_url: 'http://shop.test/ok?s={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://shop.test/cart',
    expires_at: Math.floor(Date.now() / 1000) + 3600,
  });
}

describe('payment fake against the SDK', () => {
  it('creates and retrieves a checkout session shaped as Checkout.Session', async () => {
    const session = await newSession();
    expect(session).toMatchObject({
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: 2 * 3480 + 595,
      amount_subtotal: 2 * 3480 + 595,
      currency: 'eur',
      client_reference_id: 'order-1',
      customer_email: 'c@example.test',
      metadata: { orderId: 'order-1' },
      livemode: false,
      payment_intent: null,
    });
    expect(typeof session.id).toBe('string');
    expect(typeof session.created).toBe('number');
    expect(typeof session.expires_at).toBe('number');
    expect(session.url).toMatch(/\/pay\/cs_test_/);
    const again = await client.checkout.sessions.retrieve(session.id);
    expect(again.id).toBe(session.id);
  });

  it('answers bad parameters the way the SDK raises them (StripeInvalidRequestError with the param)', async () => {
    const err = await client.checkout.sessions
      .create({ mode: 'payment', line_items: [], success_url: 'http://x.test' })
      .catch((e: unknown) => e as { type: string; param?: string; statusCode?: number });
    expect(err).toMatchObject({ type: 'StripeInvalidRequestError', param: 'line_items', statusCode: 400 });
  });

  it('treats the published test cards as documented and sends a signed completed event', async () => {
    const session = await newSession();
    expect((await fake.pay(session.id, '4000 0000 0000 0002')).ok).toBe(false);
    expect(fake.session(session.id)?.status).toBe('open');
    const before = received.length;
    expect((await fake.pay(session.id, '4242 4242 4242 4242')).ok).toBe(true);
    await fake.settle();
    const delivery = received.slice(before).find((r) => r.body.includes(session.id));
    expect(delivery).toBeDefined();
    const event = client.webhooks.constructEvent(delivery!.body, delivery!.signature, SECRET);
    expect(event.type).toBe('checkout.session.completed');
    const paid = event.data.object as Stripe.Checkout.Session;
    expect(paid.payment_status).toBe('paid');
    expect(typeof paid.payment_intent).toBe('string');
    expect(() => client.webhooks.constructEvent(delivery!.body, delivery!.signature, 'whsec_other')).toThrow();
  });

  it('refunds a paid session once (Refund), and expires an open one (checkout.session.expired)', async () => {
    const session = await newSession();
    await fake.pay(session.id, '4242424242424242');
    await fake.settle();
    const intent = fake.session(session.id)!.payment_intent!;
    const refund = await client.refunds.create({ payment_intent: intent });
    expect(refund).toMatchObject({
      object: 'refund',
      amount: 2 * 3480 + 595,
      currency: 'eur',
      status: 'succeeded',
      payment_intent: intent,
    });
    await expect(client.refunds.create({ payment_intent: intent })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
    });
    const open = await newSession();
    const expired = await client.checkout.sessions.expire(open.id);
    expect(expired.status).toBe('expired');
    await expect(client.checkout.sessions.expire(open.id)).rejects.toMatchObject({ statusCode: 400 });
  });

  it('retries a webhook that got a non-2xx answer until it gets a 2xx', async () => {
    const session = await newSession();
    failFirst = 2;
    const before = received.length;
    await fake.pay(session.id, '4242424242424242');
    await fake.settle();
    const attempts = received.slice(before).filter((r) => r.body.includes(session.id));
    expect(attempts).toHaveLength(3);
    const deliveries = fake.deliveries
      .filter((d) => attempts.length && d.type === 'checkout.session.completed')
      .slice(-3);
    expect(deliveries.map((d) => d.status)).toEqual([500, 500, 200]);
  });
});

describe('test card numbers', () => {
  // source: ISO/IEC 7812-1 Luhn check; the payment provider's published test numbers (from memory)
  it('checks the Luhn digit', () => {
    expect(luhnValid('4242424242424242')).toBe(true);
    expect(luhnValid('4242424242424241')).toBe(false);
  });
  it('declines 4000 0000 0000 0002 with a message for people', () => {
    const outcome = testCardOutcome('4000 0000 0000 0002');
    expect(outcome).toMatchObject({ ok: false, code: 'card_declined' });
  });
});
