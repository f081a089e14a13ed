/**
 * (Over 350 lines on purpose: the fake API, its hosted page handler and its webhook delivery are one small server
 * that is easier to check against the SDK when read in one place.)
 * A local fake of the payment provider's HTTP API, for development and tests (started when no payment key is set,
 * as the fake SMTP server is). It implements only the calls Nestwright makes: create, retrieve and expire a checkout
 * session, and create a refund. It serves its own hosted payment page, treats the provider's published test cards
 * as documented, and sends `checkout.session.*` events to the webhook endpoint signed in the provider's scheme
 * (`t=<unix>,v1=<HMAC-SHA256 of "t.payload">`), retrying non-2xx answers with exponential backoff.
 * State is kept in memory: a restart forgets open sessions, as a real test account would not, which the shop
 * survives (their orders expire).
 */
import { createHmac, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { fakePaymentPage } from './fakePaymentPage';
import { parseFormBody } from './parseFormBody';
import { testCardOutcome } from './testCards';

/** The API version the fake claims in its events. */
const FAKE_API_VERSION = '2026-10-28.endive';

/** Settings of the fake. */
export interface FakePaymentProviderOptions {
  /** Secret used to sign webhooks (`whsec_...`). */
  webhookSecret: string;
  /** Where events go; a function when the address is known only after the app listens. */
  webhookUrl: string | (() => string | undefined);
  /** First retry delay after a failed delivery; doubles each time (default 1 s). */
  retryBaseMs?: number;
  /** Longest delay between attempts (default 60 s). */
  retryMaxMs?: number;
  /** Deliveries per event before giving up (default 8). */
  maxAttempts?: number;
  /** Problems worth a line in the server log. */
  log?: (line: string) => void;
}

/** A line item as the fake keeps it. */
interface FakeLineItem {
  name: string;
  quantity: number;
  unitAmount: number;
}

/** A checkout session as the provider's API shows it (the fields the SDK's Checkout.Session type names). */
export interface FakeSession {
  id: string;
  object: 'checkout.session';
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer_email: string | null;
  expires_at: number;
  livemode: false;
  metadata: Record<string, string>;
  mode: 'payment';
  payment_intent: string | null;
  payment_status: 'unpaid' | 'paid';
  status: 'open' | 'complete' | 'expired';
  success_url: string | null;
  url: string | null;
}

/** One webhook delivery attempt (tests read these). */
export interface FakeDelivery {
  eventId: string;
  type: string;
  attempt: number;
  status: number | 'network-error';
  at: number;
}

interface PendingEvent {
  id: string;
  type: string;
  payload: string;
  attempts: number;
  timer?: NodeJS.Timeout;
  done: boolean;
}

class FakeApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly code?: string,
    readonly param?: string,
  ) {
    super(message);
  }
}

/** The fake provider. */
export class FakePaymentProvider {
  private readonly server: Server;
  private readonly sessions = new Map<string, FakeSession>();
  private readonly lineItems = new Map<string, FakeLineItem[]>();
  private readonly refunds = new Map<string, number>();
  private readonly pending = new Set<PendingEvent>();
  private readonly options: Required<Omit<FakePaymentProviderOptions, 'log'>> & Pick<FakePaymentProviderOptions, 'log'>;
  private portNumber = 0;
  private closed = false;
  /** Every delivery attempt, oldest first. */
  readonly deliveries: FakeDelivery[] = [];

  /** @param options - secret, endpoint and retry settings */
  constructor(options: FakePaymentProviderOptions) {
    this.options = { retryBaseMs: 1000, retryMaxMs: 60_000, maxAttempts: 8, ...options };
    this.server = createServer((req, res) => {
      this.handle(req, res).catch((err: unknown) => {
        if (err instanceof FakeApiError) return sendJson(res, err.status, { error: apiError(err) });
        this.options.log?.(`Payment fake: ${err instanceof Error ? err.message : String(err)}`);
        sendJson(res, 500, { error: { type: 'api_error', message: 'The fake failed.' } });
      });
    });
  }

  /** The port it listens on. */
  get port(): number {
    return this.portNumber;
  }

  /** `http://127.0.0.1:<port>` */
  get url(): string {
    return `http://127.0.0.1:${this.portNumber}`;
  }

  /**
   * Starts listening on localhost.
   * @param port - 0 picks a free port
   */
  listen(port = 0): Promise<number> {
    return new Promise((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, '127.0.0.1', () => {
        this.server.off('error', reject);
        this.portNumber = (this.server.address() as AddressInfo).port;
        resolve(this.portNumber);
      });
    });
  }

  /** Stops listening and drops pending retries. */
  close(): Promise<void> {
    this.closed = true;
    for (const event of this.pending) clearTimeout(event.timer);
    this.pending.clear();
    return new Promise((resolve) => {
      this.server.close(() => resolve());
      this.server.closeAllConnections();
    });
  }

  /**
   * A session as stored (tests).
   * @param id - the session id
   */
  session(id: string): FakeSession | undefined {
    return this.sessions.get(id);
  }

  /**
   * Pays an open session as if the customer had used the card (tests that skip the browser).
   * @param id - the session id
   * @param cardNumber - a test card number
   * @returns the card outcome
   */
  async pay(id: string, cardNumber: string): Promise<ReturnType<typeof testCardOutcome>> {
    const session = this.openSession(id);
    const outcome = testCardOutcome(cardNumber);
    if (outcome.ok) {
      session.status = 'complete';
      session.payment_status = 'paid';
      session.payment_intent = newId('pi');
      await this.emit('checkout.session.completed', session, true);
    }
    return outcome;
  }

  /** Resolves when no event is waiting for a delivery or retry. */
  async settle(): Promise<void> {
    while ([...this.pending].some((event) => !event.done)) await new Promise((r) => setTimeout(r, 20));
  }

  private openSession(id: string): FakeSession {
    const session = this.sessions.get(id);
    if (!session)
      throw new FakeApiError(
        404,
        'invalid_request_error',
        `No such checkout.session: '${id}'`,
        'resource_missing',
        'id',
      );
    if (session.status !== 'open')
      throw new FakeApiError(
        400,
        'invalid_request_error',
        `This Checkout Session is ${session.status}.`,
        'checkout_session_not_open',
      );
    return session;
  }

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://fake.local');
    const body = await readBody(req);
    const page = /^\/pay\/([\w-]+)$/.exec(url.pathname);
    if (page) return this.handlePage(req.method ?? 'GET', page[1], body, res);
    if (!url.pathname.startsWith('/v1/'))
      throw new FakeApiError(404, 'invalid_request_error', 'Unrecognized request URL.');
    const auth = req.headers.authorization ?? '';
    if (!/^Bearer sk_test_\w+/.test(auth))
      throw new FakeApiError(401, 'invalid_request_error', 'Invalid API Key provided (the fake takes sk_test_ keys).');
    const params = parseFormBody(body);
    const method = req.method ?? 'GET';
    let match: RegExpExecArray | null;
    if (method === 'POST' && url.pathname === '/v1/checkout/sessions')
      return sendJson(res, 200, this.createSession(params));
    if (method === 'GET' && (match = /^\/v1\/checkout\/sessions\/([\w-]+)$/.exec(url.pathname))) {
      const session = this.sessions.get(match[1]);
      if (!session)
        throw new FakeApiError(
          404,
          'invalid_request_error',
          `No such checkout.session: '${match[1]}'`,
          'resource_missing',
          'id',
        );
      return sendJson(res, 200, session);
    }
    if (method === 'POST' && (match = /^\/v1\/checkout\/sessions\/([\w-]+)\/expire$/.exec(url.pathname))) {
      const session = this.sessions.get(match[1]);
      if (!session)
        throw new FakeApiError(
          404,
          'invalid_request_error',
          `No such checkout.session: '${match[1]}'`,
          'resource_missing',
          'id',
        );
      if (session.status !== 'open')
        throw new FakeApiError(
          400,
          'invalid_request_error',
          'Only Checkout Sessions with a status in ["open"] can be expired.',
        );
      session.status = 'expired';
      session.url = null;
      await this.emit('checkout.session.expired', session, false);
      return sendJson(res, 200, session);
    }
    if (method === 'POST' && url.pathname === '/v1/refunds') return sendJson(res, 200, this.createRefund(params));
    throw new FakeApiError(404, 'invalid_request_error', `Unrecognized request URL (${method}: ${url.pathname}).`);
  }

  private createSession(params: Record<string, unknown>): FakeSession {
    const items = Array.isArray(params.line_items) ? (params.line_items as Array<Record<string, unknown>>) : [];
    if (params.mode !== 'payment') throw param('mode', 'The fake supports only mode=payment.');
    if (items.length === 0) throw param('line_items', 'line_items is required in payment mode.');
    let currency = '';
    const lines: FakeLineItem[] = items.map((item, i) => {
      const data = (item.price_data ?? {}) as Record<string, unknown>;
      const product = (data.product_data ?? {}) as Record<string, unknown>;
      const unitAmount = Number(data.unit_amount);
      const quantity = Number(item.quantity ?? 1);
      if (!Number.isInteger(unitAmount) || unitAmount < 0)
        throw param(`line_items[${i}][price_data][unit_amount]`, 'unit_amount must be a non-negative integer.');
      if (!Number.isInteger(quantity) || quantity < 1)
        throw param(`line_items[${i}][quantity]`, 'quantity must be at least 1.');
      const itemCurrency = String(data.currency ?? '').toLowerCase();
      if (!/^[a-z]{3}$/.test(itemCurrency))
        throw param(`line_items[${i}][price_data][currency]`, 'currency is required.');
      if (currency && itemCurrency !== currency)
        throw param('line_items', 'All line items must use the same currency.');
      currency = itemCurrency;
      return { name: String(product.name ?? 'Item'), quantity, unitAmount };
    });
    const total = lines.reduce((sum, l) => sum + l.unitAmount * l.quantity, 0);
    const now = Math.floor(Date.now() / 1000);
    const expiresAt = params.expires_at ? Number(params.expires_at) : now + 24 * 3600;
    if (!Number.isInteger(expiresAt) || expiresAt < now + 30 * 60 - 5 || expiresAt > now + 24 * 3600 + 5)
      throw param('expires_at', 'expires_at must be between 30 minutes and 24 hours from now.');
    const id = newId('cs_test');
    const session: FakeSession = {
      id,
      object: 'checkout.session',
      amount_subtotal: total,
      amount_total: total,
      cancel_url: typeof params.cancel_url === 'string' ? params.cancel_url : null,
      client_reference_id: typeof params.client_reference_id === 'string' ? params.client_reference_id : null,
      created: now,
      currency,
      customer_email: typeof params.customer_email === 'string' ? params.customer_email : null,
      expires_at: expiresAt,
      livemode: false,
      metadata: (params.metadata ?? {}) as Record<string, string>,
      mode: 'payment',
      payment_intent: null,
      payment_status: 'unpaid',
      status: 'open',
      success_url: typeof params.success_url === 'string' ? params.success_url : null,
      url: `${this.url}/pay/${id}`,
    };
    this.sessions.set(id, session);
    this.lineItems.set(id, lines);
    return session;
  }

  private createRefund(params: Record<string, unknown>) {
    const intent = String(params.payment_intent ?? '');
    const session = [...this.sessions.values()].find((s) => s.payment_intent && s.payment_intent === intent);
    if (!session)
      throw new FakeApiError(
        400,
        'invalid_request_error',
        `No such payment_intent: '${intent}'`,
        'resource_missing',
        'payment_intent',
      );
    const refunded = this.refunds.get(intent) ?? 0;
    const amount = params.amount === undefined ? session.amount_total - refunded : Number(params.amount);
    if (!Number.isInteger(amount) || amount <= 0 || refunded + amount > session.amount_total)
      throw new FakeApiError(
        400,
        'invalid_request_error',
        refunded >= session.amount_total
          ? 'This payment has already been refunded.'
          : 'Refund amount is greater than what is left to refund.',
        'charge_already_refunded',
        'amount',
      );
    this.refunds.set(intent, refunded + amount);
    return {
      id: newId('re'),
      object: 'refund' as const,
      amount,
      currency: session.currency,
      created: Math.floor(Date.now() / 1000),
      metadata: (params.metadata ?? {}) as Record<string, string>,
      payment_intent: intent,
      reason: typeof params.reason === 'string' ? params.reason : null,
      status: 'succeeded' as const,
    };
  }

  private async handlePage(method: string, id: string, body: string, res: ServerResponse): Promise<void> {
    const session = this.sessions.get(id);
    if (!session) {
      res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8' });
      res.end('This payment page does not exist.');
      return;
    }
    const base = {
      sessionId: id,
      email: session.customer_email,
      currency: session.currency,
      amountTotal: session.amount_total,
      lines: (this.lineItems.get(id) ?? []).map((l) => ({
        name: l.name,
        quantity: l.quantity,
        amountMinor: l.unitAmount * l.quantity,
      })),
      cancelUrl: session.cancel_url,
    };
    const html = (status: number, extra: Partial<Parameters<typeof fakePaymentPage>[0]>) => {
      res.writeHead(status, { 'Content-Type': 'text/html; charset=utf-8', 'Cache-Control': 'no-store' });
      res.end(fakePaymentPage({ ...base, ...extra }));
    };
    if (session.status !== 'open')
      return html(200, {
        closedText:
          session.status === 'complete'
            ? 'This order is already paid.'
            : 'This payment page has expired: start again from the shop.',
      });
    if (method !== 'POST') return html(200, {});
    const cardNumber = String(parseFormBody(body).cardNumber ?? '');
    const outcome = await this.pay(id, cardNumber);
    if (!outcome.ok) return html(402, { error: outcome.message, cardNumber });
    const target = (session.success_url ?? '/').replace('{CHECKOUT_SESSION_ID}', id);
    res.writeHead(303, { Location: target });
    res.end();
  }

  /**
   * Queues an event for the webhook endpoint; `waitFirst` waits for the first attempt (so a customer returning
   * from the payment page usually finds the order already paid).
   */
  private async emit(type: string, object: FakeSession, waitFirst: boolean): Promise<void> {
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: FAKE_API_VERSION,
      created: Math.floor(Date.now() / 1000),
      data: { object: { ...object } },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
    };
    const pending: PendingEvent = { id: event.id, type, payload: JSON.stringify(event), attempts: 0, done: false };
    this.pending.add(pending);
    const first = this.deliver(pending);
    if (waitFirst) await first;
  }

  private async deliver(event: PendingEvent): Promise<void> {
    if (this.closed) return;
    const target = typeof this.options.webhookUrl === 'function' ? this.options.webhookUrl() : this.options.webhookUrl;
    event.attempts += 1;
    let status: number | 'network-error' = 'network-error';
    if (target) {
      try {
        const response = await fetch(target, {
          method: 'POST',
          headers: {
            'Content-Type': 'application/json; charset=utf-8',
            'Stripe-Signature': signPayload(event.payload, this.options.webhookSecret),
            'User-Agent': 'nestwright-payment-fake',
          },
          body: event.payload,
          signal: AbortSignal.timeout(10_000),
        });
        status = response.status;
        await response.arrayBuffer();
      } catch {
        status = 'network-error';
      }
    }
    this.deliveries.push({ eventId: event.id, type: event.type, attempt: event.attempts, status, at: Date.now() });
    if (typeof status === 'number' && status >= 200 && status < 300) {
      event.done = true;
      this.pending.delete(event);
      return;
    }
    if (event.attempts >= this.options.maxAttempts || this.closed) {
      this.options.log?.(`Payment fake: gave up delivering ${event.type} ${event.id} after ${event.attempts} attempts`);
      event.done = true;
      this.pending.delete(event);
      return;
    }
    const delay = Math.min(this.options.retryMaxMs, this.options.retryBaseMs * 2 ** (event.attempts - 1));
    event.timer = setTimeout(() => void this.deliver(event), delay);
    event.timer.unref();
  }
}

/**
 * The signature header for a payload, in the provider's scheme: `t=<unix seconds>,v1=<hex HMAC-SHA256>` of
 * `"<t>.<payload>"` keyed with the endpoint secret.
 * @param payload - the exact body sent
 * @param secret - the endpoint's signing secret
 * @param timestamp - seconds since 1970 (now by default)
 */
export function signPayload(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

function newId(prefix: string): string {
  return `${prefix}_${randomBytes(18).toString('base64url').replace(/[-_]/g, 'x')}`;
}

function param(name: string, message: string): FakeApiError {
  return new FakeApiError(400, 'invalid_request_error', message, 'parameter_invalid', name);
}

function apiError(err: FakeApiError) {
  return {
    type: err.type,
    message: err.message,
    ...(err.code ? { code: err.code } : {}),
    ...(err.param ? { param: err.param } : {}),
  };
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'Content-Type': 'application/json', 'Request-Id': newId('req') });
  res.end(JSON.stringify(body));
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > 1024 * 1024) req.destroy(new Error('body too large'));
      else chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}
