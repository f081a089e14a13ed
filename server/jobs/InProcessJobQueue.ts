/**
 * The in-process back end of {@link JobQueue}, used with PGlite (one process owns the database): jobs wait in memory,
 * run on timers in this process, are retried with backoff and aborted at their time limit; a job whose last attempt
 * fails is written to `job_dead_letters`. Jobs waiting in memory are lost on a restart, as before; work that must
 * survive one keeps its state in the database (the mail outbox, variant statuses) and is sent again at start.
 */
import { randomUUID } from 'node:crypto';
import type { AppContext } from '../context';
import { jobDeadLetters } from '../db/schema';
import type { AnyJobDefinition, JobDefinition, JobQueue, SendOptions } from './JobQueue';
import { retryDelaySec, TimeLimitError, withTimeLimit } from './jobTiming';

/** Key of the jobs a schedule sends, so ticks never pile up behind a slow run. */
export const PERIODIC_KEY = 'periodic';

interface WaitingJob {
  id: string;
  job: AnyJobDefinition;
  data: unknown;
  key: string | undefined;
  attempt: number;
  runAtMs: number;
}

/** Runs jobs inside this process; see the file comment. */
export class InProcessJobQueue implements JobQueue {
  readonly kind = 'in-process' as const;
  private readonly waiting: WaitingJob[] = [];
  private readonly running = new Map<string, { job: WaitingJob; abort: AbortController; done: Promise<void> }>();
  private readonly working = new Map<string, AnyJobDefinition>();
  private readonly timers = new Set<NodeJS.Timeout>();
  private stopped = false;
  private wake: { timer: NodeJS.Timeout; atMs: number } | undefined;

  /** @param ctx - the app context handlers receive (read when a job runs, so it may be completed later) */
  constructor(private readonly ctx: () => AppContext) {}

  async start(): Promise<void> {}

  async send<T>(job: JobDefinition<T>, data: T, options: SendOptions = {}): Promise<string | null> {
    const parsed = job.data.parse(data);
    if (this.stopped) return null;
    if (options.key !== undefined && this.waiting.some((w) => w.job.name === job.name && w.key === options.key))
      return null;
    const entry: WaitingJob = {
      id: randomUUID(),
      job,
      data: parsed,
      key: options.key,
      attempt: 1,
      runAtMs: Date.now() + (options.startAfterSec ?? 0) * 1000,
    };
    this.enqueue(entry);
    return entry.id;
  }

  async work(jobs: readonly AnyJobDefinition[]): Promise<void> {
    for (const job of jobs) {
      if (this.working.has(job.name)) continue;
      this.working.set(job.name, job);
      if (job.everySec !== undefined) {
        const tick = () =>
          this.send(job, {}, { key: PERIODIC_KEY }).catch((err: unknown) =>
            this.ctx().log(`Periodic job ${job.name} could not be queued: ${String(err)}`),
          );
        const timer = setInterval(() => void tick(), job.everySec * 1000);
        timer.unref();
        this.timers.add(timer);
      }
    }
    this.pump();
  }

  async drain(): Promise<void> {
    for (;;) {
      const now = Date.now();
      const due = this.waiting.some((w) => w.runAtMs <= now && this.working.has(w.job.name));
      if (this.running.size === 0 && !due) return;
      await Promise.race([...[...this.running.values()].map((r) => r.done), sleep(20)]);
    }
  }

  async stop(): Promise<void> {
    this.stopped = true;
    for (const timer of this.timers) {
      clearTimeout(timer);
      clearInterval(timer);
    }
    this.timers.clear();
    this.wake = undefined;
    this.waiting.length = 0;
    for (const run of this.running.values()) run.abort.abort(new Error('the job queue stopped'));
    await Promise.all([...this.running.values()].map((r) => r.done));
  }

  private enqueue(entry: WaitingJob): void {
    this.waiting.push(entry);
    queueMicrotask(() => this.pump());
  }

  private pump(): void {
    if (this.stopped) return;
    const now = Date.now();
    for (let i = 0; i < this.waiting.length; i++) {
      const entry = this.waiting[i];
      const job = this.working.get(entry.job.name);
      if (!job || entry.runAtMs > now) continue;
      const active = [...this.running.values()].filter((r) => r.job.job.name === job.name).length;
      if (active >= (job.concurrency ?? 1)) continue;
      this.waiting.splice(i--, 1);
      this.launch(job, entry);
    }
    this.armWake();
  }

  /**
   * Keeps one timer for the earliest waiting job that is not due yet. `pump` checks due-ness with `Date.now()`,
   * while timers run on the event loop's own millisecond clock and may fire up to a millisecond before that:
   * a job found not due must get a new timer, or it would wait until something else wakes the queue.
   */
  private armWake(): void {
    const now = Date.now();
    let nextMs = Infinity;
    for (const entry of this.waiting)
      if (entry.runAtMs > now && this.working.has(entry.job.name)) nextMs = Math.min(nextMs, entry.runAtMs);
    if (nextMs === Infinity || (this.wake && this.wake.atMs <= nextMs)) return;
    if (this.wake) {
      clearTimeout(this.wake.timer);
      this.timers.delete(this.wake.timer);
    }
    const timer = setTimeout(
      () => {
        this.timers.delete(timer);
        this.wake = undefined;
        this.pump();
      },
      nextMs - now + 1,
    );
    timer.unref();
    this.timers.add(timer);
    this.wake = { timer, atMs: nextMs };
  }

  private launch(job: AnyJobDefinition, entry: WaitingJob): void {
    const abort = new AbortController();
    const done = this.attempt(job, entry, abort).finally(() => {
      this.running.delete(entry.id);
      this.pump();
    });
    this.running.set(entry.id, { job: entry, abort, done });
  }

  private async attempt(job: AnyJobDefinition, entry: WaitingJob, abort: AbortController): Promise<void> {
    const ctx = this.ctx();
    try {
      const data = job.data.parse(entry.data);
      await withTimeLimit(job.timeLimitSec, abort, (signal) =>
        job.handler(data, { ctx, signal, attempt: entry.attempt, jobId: entry.id }),
      );
    } catch (err) {
      if (this.stopped) return;
      const message = err instanceof Error ? err.message : String(err);
      if (entry.attempt <= job.retry.limit) {
        const delaySec = retryDelaySec(job.retry, entry.attempt);
        ctx.log(`Job ${job.name} failed (attempt ${entry.attempt}), retrying in ${delaySec} s: ${message}`);
        this.enqueue({ ...entry, attempt: entry.attempt + 1, runAtMs: Date.now() + delaySec * 1000 });
        return;
      }
      ctx.log(`Job ${job.name} failed its last attempt (${entry.attempt}): ${message}`);
      await ctx.db
        .insert(jobDeadLetters)
        .values({
          jobName: job.name,
          jobId: entry.id,
          data: entry.data ?? null,
          error: err instanceof TimeLimitError ? err.message : message,
          attempts: entry.attempt,
        })
        .catch((writeErr: unknown) => ctx.log(`Could not record the dead letter of ${job.name}: ${String(writeErr)}`));
    }
  }
}

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}
