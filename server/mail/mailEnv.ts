import { z } from 'zod';

/** Mail settings read from the environment (beside server/env.ts, which the mail feature does not change). */
export const MailEnvSchema = z.object({
  /** An SMTP server to deliver to; when unset the app starts its own fake SMTP server and captures every message. */
  SMTP_HOST: z.string().min(1).optional(),
  /** Port of SMTP_HOST, or of the fake server (0 = any free port). */
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(0),
  /** Sender address of product mail. */
  MAIL_FROM: z.string().min(3).default('Nestwright <no-reply@fernhollow.test>'),
});
/** Mail settings. */
export type MailEnv = z.infer<typeof MailEnvSchema>;

/**
 * Parses the mail settings or throws an Error naming the bad variable.
 * @param source - variables to read, `process.env` by default
 */
export function loadMailEnv(source: Record<string, string | undefined> = process.env): MailEnv {
  const result = MailEnvSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid mail environment:\n${lines.join('\n')}`);
  }
  return result.data;
}
