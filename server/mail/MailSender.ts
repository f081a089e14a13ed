import { and, asc, eq, lte } from 'drizzle-orm';
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
  /** How often the outbox is checked for due retries (default 1 s). */
  pollMs?: number;
  /** Where delivery errors are reported. */
  log?: (line: string) => void;
}

/**
 * Delivers the outbox over SMTP with nodemailer. A failed delivery keeps the message pending with the error and a
 * later `nextAttemptAt` (exponential backoff), so a mail server that is down never loses a workflow message.
 */
export class MailSender {
  private readonly transport: Transporter;
  private readonly options: Required<Omit<MailSenderOptions, 'log'>> & Pick<MailSenderOptions, 'log'>;
  private timer: NodeJS.Timeout | undefined;
  private running: Promise<void> | undefined;
  private again = false;
  private stopped = false;

  /**
   * @param db - database holding the outbox
   * @param options - SMTP server, sender and retry settings
   */
  constructor(
    private readonly db: Db,
    options: MailSenderOptions,
  ) {
    this.options = { baseDelayMs: 2000, maxDelayMs: 300_000, maxAttempts: 12, pollMs: 1000, ...options };
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

  /** Starts the periodic check for due messages. */
  start(): void {
    this.timer = setInterval(() => this.kick(), this.options.pollMs);
    this.timer.unref();
    this.kick();
  }

  /** Sends what is due now (called after a workflow step queued a message). */
  kick(): void {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    this.running = this.flush()
      .catch((err: unknown) => this.options.log?.(`Mail outbox: ${err instanceof Error ? err.message : String(err)}`))
      .finally(() => {
        this.running = undefined;
        if (this.again && !this.stopped) {
          this.again = false;
          this.kick();
        }
      });
  }

  /** Resolves when the current delivery round is over. */
  async settle(): Promise<void> {
    while (this.running) await this.running;
  }

  /** Stops the timer and waits for the current round. */
  async stop(): Promise<void> {
    this.stopped = true;
    clearInterval(this.timer);
    await this.settle();
    this.transport.close();
  }

  /**
   * Delay before attempt number `attempts + 1`.
   * @param attempts - attempts made so far (at least 1)
   */
  retryDelayMs(attempts: number): number {
    return Math.min(this.options.maxDelayMs, this.options.baseDelayMs * 2 ** (attempts - 1));
  }

  private async flush(): Promise<void> {
    const due = await this.db
      .select()
      .from(mailOutbox)
      .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, new Date())))
      .orderBy(asc(mailOutbox.id))
      .limit(20);
    for (const mail of due) {
      if (this.stopped) return;
      try {
        await this.transport.sendMail({ from: this.options.from, to: mail.to, subject: mail.subject, text: mail.text });
        await this.db
          .update(mailOutbox)
          .set({ status: 'sent', attempts: mail.attempts + 1, sentAt: new Date(), lastError: null })
          .where(eq(mailOutbox.id, mail.id));
      } catch (err) {
        const attempts = mail.attempts + 1;
        const failed = attempts >= this.options.maxAttempts;
        await this.db
          .update(mailOutbox)
          .set({
            status: failed ? 'failed' : 'pending',
            attempts,
            lastError: err instanceof Error ? err.message : String(err),
            nextAttemptAt: new Date(Date.now() + this.retryDelayMs(attempts)),
          })
          .where(eq(mailOutbox.id, mail.id));
      }
    }
  }
}
