import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/client';
import { mailMessages } from '../db/schema';
import { parseCapturedMail } from './parseCapturedMail';

/** Largest message the fake server accepts. */
const MAX_MESSAGE_BYTES = 1024 * 1024;

/**
 * A local SMTP server for development and tests: accepts every message on localhost without authentication and
 * stores it in `mail_messages`, so the admin page can show what the product would have sent.
 */
export class FakeSmtpServer {
  private readonly server: SMTPServer;
  private portNumber = 0;

  /** @param db - where captured messages are stored */
  constructor(private readonly db: Db) {
    this.server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['AUTH', 'STARTTLS'],
      size: MAX_MESSAGE_BYTES,
      logger: false,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('error', callback);
        stream.on('end', () => {
          const { subject, text } = parseCapturedMail(Buffer.concat(chunks).toString('utf8'));
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
          const to = session.envelope.rcptTo.map((rcpt) => rcpt.address);
          this.db
            .insert(mailMessages)
            .values({ from, to, subject, text })
            .then(
              () => callback(),
              (err: Error) => callback(err),
            );
        });
      },
    });
  }

  /** The port it listens on (after {@link listen}). */
  get port(): number {
    return this.portNumber;
  }

  /**
   * Starts listening on localhost.
   * @param port - 0 picks a free port
   */
  listen(port: number): Promise<number> {
    return new Promise((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, '127.0.0.1', () => {
        this.server.off('error', reject);
        this.portNumber = (this.server.server.address() as AddressInfo).port;
        resolve(this.portNumber);
      });
    });
  }

  /** Stops listening. */
  close(): Promise<void> {
    return new Promise((resolve) => this.server.close(() => resolve()));
  }
}
