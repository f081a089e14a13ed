/**
 * Tables of e-mail: the outbox and the messages the local fake SMTP server captured. Re-exported from ../schema.ts.
 */
import { index, integer, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';

/** Outgoing e-mail, queued in the same transaction as the workflow step and retried with backoff. */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: serial('id').primaryKey(),
    to: text('to').array().notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    status: text('status').$type<'pending' | 'sent' | 'failed'>().notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('mail_outbox_status_next_idx').on(table.status, table.nextAttemptAt)],
);

/** Messages the local fake SMTP server received (development and tests). */
export const mailMessages = pgTable('mail_messages', {
  id: serial('id').primaryKey(),
  from: text('from').notNull(),
  to: text('to').array().notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});
