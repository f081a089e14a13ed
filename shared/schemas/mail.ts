/**
 * Outgoing e-mail: the messages the fake SMTP server captured and the outbox.
 *
 * Route: `GET /api/mail/messages` (admin) -> {@link MailMessagesResponse}.
 */
import { z } from 'zod';

/** A message the fake SMTP server captured. */
export const MailMessageSchema = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  receivedAt: z.string(),
});
/** A captured message (see {@link MailMessageSchema}). */
export type MailMessage = z.infer<typeof MailMessageSchema>;

/** A queued outgoing message. */
export const OutboxEntrySchema = z.object({
  id: z.number().int(),
  to: z.array(z.string()),
  subject: z.string(),
  status: z.enum(['pending', 'sent', 'failed']),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
});
/** An outbox entry (see {@link OutboxEntrySchema}). */
export type OutboxEntry = z.infer<typeof OutboxEntrySchema>;

/** Answer of `GET /api/mail/messages` (newest first). */
export const MailMessagesResponseSchema = z.object({
  messages: z.array(MailMessageSchema),
  outbox: z.array(OutboxEntrySchema),
});
/** Answer of `GET /api/mail/messages`. */
export type MailMessagesResponse = z.infer<typeof MailMessagesResponseSchema>;
