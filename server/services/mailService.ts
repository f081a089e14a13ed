/** E-mail of one running app: the fake SMTP server, the outbox sender, and the admin listing. */
import { desc } from 'drizzle-orm';
import type { MailMessagesResponse } from '../../shared/schemas/mail';
import type { AppContext } from '../context';
import { mailMessages, mailOutbox } from '../db/schema';
import { FakeSmtpServer } from '../mail/FakeSmtpServer';
import { loadMailEnv, type MailEnv } from '../mail/mailEnv';
import { MailSender, type MailSenderOptions } from '../mail/MailSender';
import { DELIVER_NOW_KEY, deliverMailJob } from '../mail/deliverMailJob';
import { mailRuntime, setMailRuntime, type MailRuntime } from '../mail/mailRuntimes';

export type { MailRuntime } from '../mail/mailRuntimes';
export { mailRuntime } from '../mail/mailRuntimes';

/** Options of {@link startMail}. */
export interface StartMailOptions {
  /** Mail settings (read from process.env by default). */
  env?: MailEnv;
  /** Start no fake server even without SMTP_HOST (tests of a mail server that is down). */
  noFakeServer?: boolean;
  /** Retry settings of the sender. */
  retry?: Pick<MailSenderOptions, 'baseDelayMs' | 'maxDelayMs' | 'maxAttempts'>;
}

/**
 * Makes this process the one that delivers mail: starts the fake SMTP server (unless SMTP_HOST points elsewhere),
 * the outbox sender, and works the `mail.deliver` job on the app's job queue (then delivers what is already due).
 * @param ctx - the app context
 * @param options - settings
 */
export async function startMail(ctx: AppContext, options: StartMailOptions = {}): Promise<MailRuntime> {
  const env = options.env ?? loadMailEnv();
  let smtp: FakeSmtpServer | null = null;
  let host = env.SMTP_HOST ?? '127.0.0.1';
  let port = env.SMTP_PORT;
  if (!env.SMTP_HOST && !options.noFakeServer) {
    smtp = new FakeSmtpServer(ctx.db);
    port = await smtp.listen(env.SMTP_PORT);
    host = '127.0.0.1';
  }
  const sender = new MailSender(ctx.db, { host, port, from: env.MAIL_FROM, log: ctx.log, ...options.retry });
  const runtime = { smtp, sender, port };
  setMailRuntime(ctx, runtime);
  await ctx.jobs.work([deliverMailJob]);
  kickMail(ctx);
  return runtime;
}

/** Stops the sender and the fake server of an app. @param ctx - the app context */
export async function stopMail(ctx: AppContext): Promise<void> {
  const runtime = mailRuntime(ctx);
  if (!runtime) return;
  setMailRuntime(ctx, undefined);
  await runtime.sender.stop();
  await runtime.smtp?.close();
}

/**
 * Asks for a delivery round now (after a workflow step committed a message); whichever process delivers mail runs
 * it. Errors of the queue are logged, never thrown: the message is safe in the outbox either way. A context without
 * a queue (the seed) leaves the message for the next periodic round.
 * @param ctx - the app context
 */
export function kickMail(ctx: Partial<Pick<AppContext, 'jobs' | 'log'>>): void {
  ctx.jobs
    ?.send(deliverMailJob, {}, { key: DELIVER_NOW_KEY })
    .catch((err: unknown) => ctx.log?.(`Mail outbox: could not queue a delivery round: ${String(err)}`));
}

/**
 * Captured messages and the outbox, newest first (admin page).
 * @param ctx - the app context
 */
export async function listMail(ctx: AppContext): Promise<MailMessagesResponse> {
  const messages = await ctx.db.select().from(mailMessages).orderBy(desc(mailMessages.id)).limit(200);
  const outbox = await ctx.db.select().from(mailOutbox).orderBy(desc(mailOutbox.id)).limit(200);
  return {
    messages: messages.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })),
    outbox: outbox.map((o) => ({
      id: o.id,
      to: o.to,
      subject: o.subject,
      status: o.status,
      attempts: o.attempts,
      lastError: o.lastError,
      nextAttemptAt: o.status === 'pending' ? o.nextAttemptAt.toISOString() : null,
      createdAt: o.createdAt.toISOString(),
      sentAt: o.sentAt ? o.sentAt.toISOString() : null,
    })),
  };
}
