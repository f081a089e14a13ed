/**
 * Tables of the background-work machinery shared by every process: jobs that failed their last attempt (shown to
 * admins whichever queue back end ran them, retried or discarded by them), rate-limit counters (sign-in and
 * checkout limits hold across API processes) and the addresses of local services a worker must reach.
 * Re-exported from ../schema.ts.
 */
import { index, integer, jsonb, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { people } from './people';

/** What an admin did with a dead letter. */
export type DeadLetterResolution = 'retried' | 'discarded';

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
    /** Null while it waits for an admin; then whether it was sent again or discarded. */
    resolution: text('resolution').$type<DeadLetterResolution>(),
    resolvedAt: timestamp('resolved_at', { withTimezone: true }),
    resolvedById: text('resolved_by_id').references(() => people.id, { onDelete: 'set null' }),
  },
  (table) => [
    index('job_dead_letters_failed_at_idx').on(table.failedAt),
    uniqueIndex('job_dead_letters_job_id_idx').on(table.jobId),
  ],
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

/**
 * The current computation of a family revision when it runs as per-variant jobs (PostgreSQL): a variant job
 * carries the generation it was sent for and stores nothing once a cancel or a new computation moved it on.
 */
export const familyComputeRuns = pgTable('family_compute_runs', {
  revisionId: text('revision_id').primaryKey(),
  generation: integer('generation').notNull().default(0),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * Where a local development service started by one process listens (the payment and farm fakes), so that worker
 * processes on the same machine can reach it. Real providers are configured by settings instead.
 */
export const serviceEndpoints = pgTable('service_endpoints', {
  /** `payments-fake` or `farm-fake`. */
  name: text('name').primaryKey(),
  url: text('url').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A dead-letter row. */
export type JobDeadLetterRow = typeof jobDeadLetters.$inferSelect;
