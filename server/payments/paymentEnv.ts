import { z } from 'zod';

/** Payment settings read from the environment (beside server/env.ts, as the mail settings are). */
export const PaymentEnvSchema = z
  .object({
    /**
     * The provider's secret API key (`sk_live_...` or `sk_test_...`). When unset the app starts its own local fake of
     * the provider and points the SDK at it.
     */
    PAYMENT_SECRET_KEY: z
      .string()
      .regex(/^(sk|rk)_(test|live)_\w+$/, 'must be a secret key such as sk_test_...')
      .optional(),
    /** Signing secret of the webhook endpoint (`whsec_...`); required with PAYMENT_SECRET_KEY. */
    PAYMENT_WEBHOOK_SECRET: z
      .string()
      .regex(/^whsec_\w+$/, 'must be a webhook signing secret such as whsec_...')
      .optional(),
    /** Port of the local payment fake (0 = any free port). */
    PAYMENT_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(0),
    /** Checkouts one client may start per 10 minutes. */
    CHECKOUT_RATE_LIMIT: z.coerce.number().int().min(1).max(10_000).default(20),
  })
  .refine((env) => !env.PAYMENT_SECRET_KEY || env.PAYMENT_WEBHOOK_SECRET, {
    path: ['PAYMENT_WEBHOOK_SECRET'],
    message: 'is required when PAYMENT_SECRET_KEY is set (the endpoint signing secret from the provider dashboard)',
  });
/** Payment settings. */
export type PaymentEnv = z.infer<typeof PaymentEnvSchema>;

/**
 * Parses the payment settings or throws an Error naming the bad variable.
 * @param source - variables to read, `process.env` by default
 */
export function loadPaymentEnv(source: Record<string, string | undefined> = process.env): PaymentEnv {
  const result = PaymentEnvSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid payment environment:\n${lines.join('\n')}`);
  }
  return result.data;
}
