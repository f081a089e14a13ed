/**
 * The payment provider as one running app sees it: the official SDK client, the webhook signing secret, and the
 * local fake when no key is set (the SDK is then pointed at the fake with its `host`, `port` and `protocol`).
 */
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';
import { HttpError } from '../http/HttpError';
import { FakePaymentProvider, type FakePaymentProviderOptions } from './FakePaymentProvider';
import { loadPaymentEnv, type PaymentEnv } from './paymentEnv';

/** The payment parts of one app. */
export interface PaymentRuntime {
  client: Stripe;
  webhookSecret: string;
  /** The local fake, when the app runs its own. */
  fake: FakePaymentProvider | null;
}

/** Options of {@link startPayments}. */
export interface StartPaymentsOptions {
  env?: PaymentEnv;
  /** Where the fake delivers events (the app's own `/api/webhooks/payments`). */
  webhookUrl?: FakePaymentProviderOptions['webhookUrl'];
  /** Retry settings of the fake's webhook delivery (tests shorten them). */
  fakeRetry?: Pick<FakePaymentProviderOptions, 'retryBaseMs' | 'retryMaxMs' | 'maxAttempts'>;
  log?: (line: string) => void;
}

const runtimes = new WeakMap<object, PaymentRuntime>();

/**
 * Starts payments for an app: with PAYMENT_SECRET_KEY the SDK talks to the provider; without it a local fake starts
 * on PAYMENT_FAKE_PORT with a random signing secret and the SDK talks to that.
 * @param ctx - the app context (any object identifying the app)
 * @param options - settings
 */
export async function startPayments(ctx: object, options: StartPaymentsOptions = {}): Promise<PaymentRuntime> {
  const env = options.env ?? loadPaymentEnv();
  let runtime: PaymentRuntime;
  if (env.PAYMENT_SECRET_KEY && env.PAYMENT_WEBHOOK_SECRET) {
    runtime = {
      client: new Stripe(env.PAYMENT_SECRET_KEY, { maxNetworkRetries: 2, timeout: 20_000 }),
      webhookSecret: env.PAYMENT_WEBHOOK_SECRET,
      fake: null,
    };
  } else {
    const webhookSecret = `whsec_${randomBytes(24).toString('hex')}`;
    const fake = new FakePaymentProvider({
      webhookSecret,
      webhookUrl: options.webhookUrl ?? (() => undefined),
      log: options.log,
      ...options.fakeRetry,
    });
    await fake.listen(env.PAYMENT_FAKE_PORT);
    runtime = { client: fakeClient(fake.port), webhookSecret, fake };
  }
  runtimes.set(ctx, runtime);
  return runtime;
}

/**
 * An SDK client pointed at a local fake.
 * @param port - the fake's port
 */
export function fakeClient(port: number): Stripe {
  return new Stripe('sk_test_local_fake', {
    host: '127.0.0.1',
    port,
    protocol: 'http',
    maxNetworkRetries: 0,
    timeout: 10_000,
  });
}

/**
 * Uses a runtime made elsewhere for an app (tests).
 * @param ctx - the app context
 * @param runtime - client, secret and fake
 */
export function setPaymentRuntime(ctx: object, runtime: PaymentRuntime): void {
  runtimes.set(ctx, runtime);
}

/** Whether an app has payments running (started or set). @param ctx - the app context */
export function hasPayments(ctx: object): boolean {
  return runtimes.has(ctx);
}

/** Stops the fake of an app, if any. @param ctx - the app context */
export async function stopPayments(ctx: object): Promise<void> {
  const runtime = runtimes.get(ctx);
  runtimes.delete(ctx);
  await runtime?.fake?.close();
}

/**
 * The app's payment runtime; 503 when payments are not running (the server started without them).
 * @param ctx - the app context
 */
export function paymentsOf(ctx: object): PaymentRuntime {
  const runtime = runtimes.get(ctx);
  if (!runtime)
    throw new HttpError(503, 'payments_unavailable', 'Payments are not available right now. Try again later.');
  return runtime;
}
