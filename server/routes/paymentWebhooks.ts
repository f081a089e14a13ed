/**
 * `POST /api/webhooks/payments`: the payment provider's events. Mounted before the JSON parser and the origin
 * check (the provider is not a browser): the raw bytes are needed to verify the signature.
 */
import express, { Router } from 'express';
import type { AppContext } from '../context';
import { handlePaymentWebhook } from '../services/checkoutService';

/**
 * Builds the webhook router (mounted at `/api/webhooks/payments`).
 * @param ctx - the application context
 */
export function paymentWebhooksRouter(ctx: AppContext): Router {
  const router = Router();
  router.post('/', express.raw({ type: () => true, limit: '1mb' }), async (req, res) => {
    const raw = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const result = await handlePaymentWebhook(ctx, raw, req.get('Stripe-Signature'));
    res.json({ received: true, applied: result.applied, outcome: result.outcome });
  });
  return router;
}
