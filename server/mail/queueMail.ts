import type { Queryable } from '../db/client';
import { mailOutbox } from '../db/schema';

/** A message to send. */
export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
}

/**
 * Queues a message in the outbox. Call it inside the transaction of the workflow step it belongs to, so the step
 * and its message commit together; the sender delivers it later and retries while the mail server is down.
 * @param db - the database or the open transaction
 * @param mail - recipients, subject and text
 */
export async function queueMail(db: Pick<Queryable, 'insert'>, mail: OutgoingMail): Promise<void> {
  if (mail.to.length === 0) return;
  await db.insert(mailOutbox).values({ to: mail.to, subject: mail.subject, text: mail.text });
}
