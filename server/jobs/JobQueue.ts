/**
 * The one interface for background work. A job is defined once with {@link defineJob} (name, payload schema, retry
 * policy, time limit, handler) and listed in ./jobRegistry.ts; code sends it with `ctx.jobs.send(job, data, { key })`.
 * Two back ends implement {@link JobQueue}: ./InProcessJobQueue.ts (PGlite, one process) and ./PgBossJobQueue.ts
 * (PostgreSQL, any number of worker processes). Handlers must be safe to run twice: a job may run again after a
 * crash, a time-out or a retry.
 */
import type { z } from 'zod';
import type { AppContext } from '../context';

/** Retry policy: `limit` further attempts after the first, `delaySec` before the first retry, doubling with `backoff`. */
export interface RetryPolicy {
  limit: number;
  delaySec: number;
  backoff: boolean;
}

/** What a handler receives beside its payload. */
export interface JobRun {
  /** The app context of the process running the job (database, environment, log, queue). */
  ctx: AppContext;
  /** Aborted when the time limit passes or the queue stops; long work should check it and stop. */
  signal: AbortSignal;
  /** 1 for the first attempt, 2 for the first retry... */
  attempt: number;
  /** The job's id (unique per send). */
  jobId: string;
}

/** A job type: what it carries, how it is retried and timed, and what it does. */
export interface JobDefinition<T = unknown> {
  /** Queue name, dotted lower case (`mail.deliver`, `family.variant`). */
  name: string;
  /** What the job does, in a few words for admins (the dead-letter list), e.g. `Sending e-mail`. */
  title?: string;
  /** The payload's shape; checked when sending and again when running. */
  data: z.ZodType<T>;
  /** Retries after a failure or a time-out; when the last one fails the job goes to the dead-letter list. */
  retry: RetryPolicy;
  /** Longest a single attempt may run, seconds; then it is aborted and counts as failed. */
  timeLimitSec: number;
  /** Jobs of this type one process runs at the same time (default 1). */
  concurrency?: number;
  /** Runs every `everySec` seconds (on PostgreSQL rounded up to whole minutes, the scheduler's resolution). */
  everySec?: number;
  /** Does the work. Must be safe to run twice for the same payload. */
  handler(data: T, run: JobRun): Promise<void>;
}

/**
 * Declares a job type (identity function that keeps the payload type).
 * @param definition - see {@link JobDefinition}
 */
export function defineJob<T>(definition: JobDefinition<T>): JobDefinition<T> {
  return definition;
}

/** A job definition of any payload type (lists of jobs). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type AnyJobDefinition = JobDefinition<any>;

/** Options of {@link JobQueue.send}. */
export interface SendOptions {
  /**
   * Idempotency key: while a job of this type with this key waits to run, sending another one with the same key
   * does nothing (returns null). Use the id of what the job works on (`variant:<id>:<lock>`, `mail`).
   */
  key?: string;
  /** Run no earlier than this many seconds from now. */
  startAfterSec?: number;
}

/** A job that failed its last attempt, kept for the admin (table `job_dead_letters`). */
export interface DeadLetter {
  id: number;
  jobName: string;
  jobId: string;
  data: unknown;
  error: string;
  attempts: number;
  failedAt: Date;
}

/** The background-work queue of one process. */
export interface JobQueue {
  /** `in-process` (PGlite) or `pg-boss` (PostgreSQL). */
  readonly kind: 'in-process' | 'pg-boss';
  /** Connects (pg-boss: installs or upgrades its schema); the in-process queue has nothing to do. */
  start(): Promise<void>;
  /**
   * Queues a job. Throws when the payload does not match the job's schema.
   * @returns the job id, or null when a job with the same key is already waiting
   */
  send<T>(job: JobDefinition<T>, data: T, options?: SendOptions): Promise<string | null>;
  /** Starts running the handlers of the given job types in this process (and their schedules). */
  work(jobs: readonly AnyJobDefinition[]): Promise<void>;
  /** Resolves when no job is running and none is due (tests; pending retries later than now do not count). */
  drain(): Promise<void>;
  /** Stops taking jobs, aborts running ones and waits for them. */
  stop(): Promise<void>;
}
