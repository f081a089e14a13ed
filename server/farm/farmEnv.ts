import { z } from 'zod';

/** Print-farm settings read from the environment (beside server/env.ts, as the mail settings are). */
export const FarmEnvSchema = z.object({
  /** The farm's API base address; when unset the app starts its own fake farm on a free local port. */
  FARM_API_URL: z.url({ protocol: /^https?$/ }).optional(),
  /** The key the farm issued to the studio (any text for the fake). */
  FARM_API_KEY: z.string().min(1).default('fake-farm-key'),
  /** Shared secret the farm signs notices with (the fake gets a random one when unset). */
  FARM_NOTICE_SECRET: z.string().min(16).optional(),
  /** Simulated seconds per real second of the fake farm's clock (600: a one-unit order ships in about 15 s). */
  FARM_FAKE_SPEED: z.coerce.number().positive().max(1_000_000).default(600),
  /** Port of the fake farm (0 = any free port). */
  FARM_FAKE_PORT: z.coerce.number().int().min(0).max(65535).default(0),
  /** How often the dispatcher and reconciliation look for work, in milliseconds. */
  FARM_POLL_MS: z.coerce.number().int().min(50).max(600_000).default(2000),
  /** First wait before sending again to a farm that could not be reached, in milliseconds (doubling after). */
  FARM_RETRY_BASE_MS: z.coerce.number().int().min(10).max(600_000).default(5000),
  /** An open work order not heard of for this long is asked about (reconciliation), in seconds. */
  FARM_RECONCILE_AFTER_S: z.coerce.number().positive().max(86_400).default(120),
});
/** Farm settings. */
export type FarmEnv = z.infer<typeof FarmEnvSchema>;

/**
 * Parses the farm settings or throws an Error naming the bad variable.
 * @param source - variables to read, `process.env` by default
 */
export function loadFarmEnv(source: Record<string, string | undefined> = process.env): FarmEnv {
  const result = FarmEnvSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid farm environment:\n${lines.join('\n')}`);
  }
  if (result.data.FARM_API_URL && !result.data.FARM_NOTICE_SECRET)
    throw new Error('Invalid farm environment:\n  FARM_NOTICE_SECRET: required when FARM_API_URL is set');
  return result.data;
}
