/**
 * Payments in a process that did not start them (`npm run worker`): with PAYMENT_SECRET_KEY the provider's SDK,
 * otherwise an SDK client of the local fake an API process on this machine advertised. Jobs that talk to the
 * provider (checkout expiry) call this before they start.
 */
import type { AppContext } from '../context';
import { findEndpoint } from '../services/serviceEndpoints';
import { loadPaymentEnv } from './paymentEnv';
import { fakeClient, hasPayments, setPaymentRuntime, startPayments } from './paymentRuntime';

/** The advertised fake address a process's client points at (processes that did not start payments). */
const fakeReached = new WeakMap<object, string>();

/**
 * Makes sure this process has payments: keeps the ones it started, or sets up a client as described above.
 * @param ctx - the app context
 * @returns false when no provider is configured and no fake is advertised yet
 */
export async function ensurePaymentsForJob(ctx: AppContext): Promise<boolean> {
  const reached = fakeReached.get(ctx);
  if (hasPayments(ctx) && reached === undefined) return true;
  const env = loadPaymentEnv();
  if (env.PAYMENT_SECRET_KEY) {
    await startPayments(ctx, { env, log: ctx.log });
    return true;
  }
  // Looked up every time: an API process that restarts starts its fake on a new port.
  const url = await findEndpoint(ctx.db, 'payments-fake');
  if (!url) return reached !== undefined;
  if (url !== reached) {
    // Webhooks go to the API process that started the fake; this process only calls the provider.
    setPaymentRuntime(ctx, { client: fakeClient(Number(new URL(url).port)), webhookSecret: '', fake: null });
    fakeReached.set(ctx, url);
  }
  return true;
}
