/** E-mail of one running app: the fake SMTP server, the outbox sender, and the admin listing. */
import { desc } from 'drizzle-orm';
import type { MailMessagesResponse } from '../../shared/schemas/family';
import type { AppContext } from '../context';
import { mailMessages, mailOutbox } from '../db/schema';
import { FakeSmtpServer } from '../mail/FakeSmtpServer';
import { loadMailEnv, type MailEnv } from '../mail/mailEnv';
import { MailSender, type MailSenderOptions } from '../mail/MailSender';

/** The mail parts running for one app context. */
export interface MailRuntime {
  /** The fake server, when the app runs its own. */
  smtp: FakeSmtpServer | null;
  sender: MailSender;
  /** Where mail is delivered. */
  port: number;
}

/** Options of {@link startMail}. */
export interface StartMailOptions {
  /** Mail settings (read from process.env by default). */
  env?: MailEnv;
  /** Start no fake server even without SMTP_HOST (tests of a mail server that is down). */
  noFakeServer?: boolean;
  /** Retry settings of the sender. */
  retry?: Pick<MailSenderOptions, 'baseDelayMs' | 'maxDelayMs' | 'maxAttempts' | 'pollMs'>;
}

const runtimes = new WeakMap<object, MailRuntime>();

/**
 * Starts mail for an app: the fake SMTP server (unless SMTP_HOST points elsewhere) and the outbox sender.
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
  sender.start();
  const runtime = { smtp, sender, port };
  runtimes.set(ctx, runtime);
  return runtime;
}

/** Stops the sender and the fake server of an app. @param ctx - the app context */
export async function stopMail(ctx: AppContext): Promise<void> {
  const runtime = runtimes.get(ctx);
  if (!runtime) return;
  runtimes.delete(ctx);
  await runtime.sender.stop();
  await runtime.smtp?.close();
}

/** Delivers due outbox messages now (no-op when mail is not started). @param ctx - the app context */
export function kickMail(ctx: object): void {
  runtimes.get(ctx)?.sender.kick();
}

/** The running mail parts of an app, if started. @param ctx - the app context */
export function mailRuntime(ctx: AppContext): MailRuntime | undefined {
  return runtimes.get(ctx);
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
