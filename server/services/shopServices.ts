/**
 * Starts and stops what the shop runs beside the HTTP server: payments (the provider's SDK, or its local fake, whose
 * address is advertised so that worker processes on this machine can reach it).
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { AppContext } from '../context';
import { startPayments, stopPayments, type StartPaymentsOptions } from '../payments/paymentRuntime';
import { advertiseEndpoint } from './serviceEndpoints';

/**
 * Starts payments for a listening server: with no payment key the local fake starts and delivers its events to
 * this server's `/api/webhooks/payments`. Payments stop when the HTTP server closes.
 * @param ctx - the app context
 * @param server - the listening HTTP server
 * @param options - payment settings (process.env by default)
 */
export async function startShopServices(
  ctx: AppContext,
  server: Server,
  options: StartPaymentsOptions = {},
): Promise<void> {
  const port = (server.address() as AddressInfo).port;
  const payments = await startPayments(ctx, {
    webhookUrl: () => `http://127.0.0.1:${port}/api/webhooks/payments`,
    log: ctx.log,
    ...options,
  });
  if (payments.fake) await advertiseEndpoint(ctx.db, 'payments-fake', `http://127.0.0.1:${payments.fake.port}`);
  ctx.log(
    payments.fake
      ? `  payments: local payment fake on port ${payments.fake.port} (no PAYMENT_SECRET_KEY set)`
      : '  payments: the payment provider, with PAYMENT_SECRET_KEY',
  );
  server.once('close', () => void stopPayments(ctx));
}
