/**
 * Tables of the background-work machinery shared by every process: jobs that failed their last attempt (shown to
 * admins whichever queue back end ran them) and rate-limit counters (sign-in throttling holds across API processes).
 * Re-exported from ../schema.ts.
 */
import { index, integer, jsonb, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';

/** A job that failed its last attempt (dead letter). */
export const jobDeadLetters = pgTable(
  'job_dead_letters',
  {
    id: serial('id').primaryKey(),
    jobName: text('job_name').notNull(),
    jobId: text('job_id').notNull(),
    data: jsonb('data').$type<unknown>().notNull(),
    error: text('error').notNull(),
    attempts: integer('attempts').notNull(),
    failedAt: timestamp('failed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('job_dead_letters_failed_at_idx').on(table.failedAt)],
);

/** Hits per key in the current window of a rate limiter (express-rate-limit store). */
export const rateLimitHits = pgTable(
  'rate_limit_hits',
  {
    /** The limiter's prefix and the client's key. */
    key: text('key').primaryKey(),
    hits: integer('hits').notNull(),
    resetAt: timestamp('reset_at', { withTimezone: true }).notNull(),
  },
  (table) => [index('rate_limit_hits_reset_at_idx').on(table.resetAt)],
);

/** A dead-letter row. */
export type JobDeadLetterRow = typeof jobDeadLetters.$inferSelect;
