import { and, asc, eq, lte, sql } from 'drizzle-orm';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Db } from '../db/client';
import { mailOutbox } from '../db/schema';

/** Settings of the sender. */
export interface MailSenderOptions {
  host: string;
  port: number;
  /** Sender address. */
  from: string;
  /** First retry delay; each further attempt doubles it (default 2 s). */
  baseDelayMs?: number;
  /** Longest delay between attempts (default 5 min). */
  maxDelayMs?: number;
  /** Attempts before a message is marked failed (default 12; failed messages stay in the outbox for the admin). */
  maxAttempts?: number;
  /** Where delivery errors are reported. */
  log?: (line: string) => void;
}

/** How long a claimed message stays reserved for the process sending it; after a crash it is due again then. */
const CLAIM_LEASE_SEC = 60;

/**
 * Delivers the outbox over SMTP with nodemailer. It runs as the `mail.deliver` job (./deliverMailJob.ts), so any
 * worker process may send: each message is claimed atomically (`FOR UPDATE SKIP LOCKED`, with a lease) before it
 * is sent, so two workers never send the same message. A failed delivery keeps the message pending with the error
 * and a later `nextAttemptAt` (exponential backoff), so a mail server that is down never loses a workflow message.
 */
export class MailSender {
  private readonly transport: Transporter;
  private readonly options: Required<Omit<MailSenderOptions, 'log'>> & Pick<MailSenderOptions, 'log'>;
  private running: Promise<unknown> | undefined;
  private stopped = false;

  /**
   * @param db - database holding the outbox
   * @param options - SMTP server, sender and retry settings
   */
  constructor(
    private readonly db: Db,
    options: MailSenderOptions,
  ) {
    this.options = { baseDelayMs: 2000, maxDelayMs: 300_000, maxAttempts: 12, ...options };
    this.transport = nodemailer.createTransport({
      host: options.host,
      port: options.port,
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 2000,
      greetingTimeout: 2000,
      socketTimeout: 5000,
    });
  }

  /**
   * Sends every message that is due now, one claim at a time.
   * @param signal - stops between messages when aborted (the job's time limit)
   * @returns when the earliest message still pending is due, or null when none is pending
   */
  deliverDue(signal?: AbortSignal): Promise<Date | null> {
    const round = (async () => {
      while (!this.stopped && !signal?.aborted) {
        const [mail] = await this.claimNext();
        if (!mail) break;
        await this.deliver(mail);
      }
      return this.nextDueAt();
    })();
    this.running = round.catch(() => {});
    return round;
  }

  /** Stops sending after the current message and closes the SMTP connection. */
  async stop(): Promise<void> {
    this.stopped = true;
    await this.running;
    this.transport.close();
  }

  /**
   * Delay before attempt number `attempts + 1`.
   * @param attempts - attempts made so far (at least 1)
   */
  retryDelayMs(attempts: number): number {
    return Math.min(this.options.maxDelayMs, this.options.baseDelayMs * 2 ** (attempts - 1));
  }

  /** Reserves the oldest due message for this process (its next attempt moves a lease ahead). */
  private claimNext() {
    const due = this.db
      .select({ id: mailOutbox.id })
      .from(mailOutbox)
      .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, new Date())))
      .orderBy(asc(mailOutbox.id))
      .limit(1)
      .for('update', { skipLocked: true });
    return this.db
      .update(mailOutbox)
      .set({ nextAttemptAt: sql`now() + make_interval(secs => ${CLAIM_LEASE_SEC})` })
      .where(eq(mailOutbox.id, sql`(${due})`))
      .returning();
  }

  private async deliver(mail: typeof mailOutbox.$inferSelect): Promise<void> {
    const attempts = mail.attempts + 1;
    try {
      await this.transport.sendMail({ from: this.options.from, to: mail.to, subject: mail.subject, text: mail.text });
      await this.db
        .update(mailOutbox)
        .set({ status: 'sent', attempts, sentAt: new Date(), lastError: null })
        .where(eq(mailOutbox.id, mail.id));
    } catch (err) {
      const failed = attempts >= this.options.maxAttempts;
      const message = err instanceof Error ? err.message : String(err);
      if (failed) this.options.log?.(`Mail to ${mail.to.join(', ')} given up after ${attempts} attempts: ${message}`);
      await this.db
        .update(mailOutbox)
        .set({
          status: failed ? 'failed' : 'pending',
          attempts,
          lastError: message,
          nextAttemptAt: new Date(Date.now() + this.retryDelayMs(attempts)),
        })
        .where(eq(mailOutbox.id, mail.id));
    }
  }

  private async nextDueAt(): Promise<Date | null> {
    const [row] = await this.db
      .select({ at: sql<Date | null>`min(${mailOutbox.nextAttemptAt})`.mapWith(mailOutbox.nextAttemptAt) })
      .from(mailOutbox)
      .where(eq(mailOutbox.status, 'pending'));
    return row?.at ?? null;
  }
}
