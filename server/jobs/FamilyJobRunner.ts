import { EventEmitter } from 'node:events';
import { eq } from 'drizzle-orm';
import type { ComputeProgressEvent, ComputeState } from '../../shared/schemas/variant';
import type { AppContext } from '../context';
import { familyRevisions } from '../db/schema';
import { computeRevision } from './computeRevision';
import { VariantWorker } from './VariantWorker';
import type { FamilyRunner, ProgressListener } from './familyRunner';
import { QueuedFamilyRunner } from './QueuedFamilyRunner';
import { resetForCompute } from './resetForCompute';
import { readComputeProgress } from './readComputeProgress';

export type { ProgressListener } from './familyRunner';

/** How long an idle worker thread is kept for the next job. */
const WORKER_IDLE_MS = 60_000;

interface QueuedJob {
  revisionId: string;
  cancelled: boolean;
}

/**
 * Computes family revisions in the background, one at a time, on a worker thread: for each distinct parameter set the
 * worker builds and analyses the mesh, then every variant sharing it is evaluated (fit, cost, bird fit, verdict) and
 * stored, and listeners get one progress event per variant. Cancelling stops the worker at once.
 */
export class FamilyJobRunner implements FamilyRunner {
  private readonly queue: QueuedJob[] = [];
  private current: QueuedJob | undefined;
  private readonly events = new EventEmitter();
  private worker = new VariantWorker();
  private idleTimer: NodeJS.Timeout | undefined;
  private closed = false;

  /** @param ctx - the app context (database, logger) */
  constructor(private readonly ctx: Pick<AppContext, 'db' | 'log'>) {
    this.events.setMaxListeners(0);
  }

  /**
   * Queues a revision for computation (its variants go back to pending). A revision already queued or running is
   * cancelled and queued again.
   * @param revisionId - the revision to compute
   */
  async enqueue(revisionId: string): Promise<void> {
    await this.cancel(revisionId, false);
    await resetForCompute(this.ctx.db, revisionId);
    this.queue.push({ revisionId, cancelled: false });
    void this.pump();
  }

  /**
   * Stops a queued or running computation of a revision.
   * @param revisionId - the revision
   * @param record - store the `cancelled` state (false when the caller resets the revision itself)
   * @returns whether something was stopped
   */
  async cancel(revisionId: string, record = true): Promise<boolean> {
    let stopped = false;
    for (let i = this.queue.length - 1; i >= 0; i--) {
      if (this.queue[i].revisionId === revisionId) {
        this.queue.splice(i, 1);
        stopped = true;
      }
    }
    if (this.current?.revisionId === revisionId && !this.current.cancelled) {
      this.current.cancelled = true;
      stopped = true;
      // Terminating the thread stops a long build at once; the next job starts a new one.
      await this.worker.close();
    }
    if (stopped && record) {
      await this.ctx.db
        .update(familyRevisions)
        .set({ computeState: 'cancelled', computeFinishedAt: new Date(), updatedAt: new Date() })
        .where(eq(familyRevisions.id, revisionId));
      this.emit(revisionId, await this.progressOf(revisionId), true);
    }
    return stopped;
  }

  /**
   * Listens to the progress of one revision.
   * @param revisionId - the revision
   * @param listener - called per event
   * @returns a function that stops listening
   */
  subscribe(revisionId: string, listener: ProgressListener): () => void {
    const handler = (event: ComputeProgressEvent, done: boolean) => listener(event, done);
    this.events.on(revisionId, handler);
    return () => this.events.off(revisionId, handler);
  }

  /** Resolves at once: progress never leaves this process. */
  async ready(): Promise<void> {}

  /** Whether the revision is queued or being computed in this process. @param revisionId - the revision */
  async isActive(revisionId: string): Promise<boolean> {
    return this.current?.revisionId === revisionId || this.queue.some((job) => job.revisionId === revisionId);
  }

  /** Resolves when nothing is queued or running (tests and the seed step wait on it). */
  async idle(): Promise<void> {
    while (this.current || this.queue.length > 0) await new Promise((resolve) => setTimeout(resolve, 20));
  }

  /** Stops every job and the worker thread. */
  async close(): Promise<void> {
    this.closed = true;
    this.queue.length = 0;
    if (this.current) this.current.cancelled = true;
    clearTimeout(this.idleTimer);
    await this.worker.close();
  }

  /** The current progress of a revision as an event. @param revisionId - the revision */
  async progressOf(revisionId: string): Promise<ComputeProgressEvent> {
    return readComputeProgress(this.ctx.db, revisionId);
  }

  private emit(revisionId: string, event: ComputeProgressEvent, done: boolean): void {
    this.events.emit(revisionId, event, done);
  }

  private async pump(): Promise<void> {
    if (this.current || this.closed) return;
    const job = this.queue.shift();
    if (!job) {
      clearTimeout(this.idleTimer);
      this.idleTimer = setTimeout(() => void this.worker.close(), WORKER_IDLE_MS);
      this.idleTimer.unref();
      return;
    }
    clearTimeout(this.idleTimer);
    this.current = job;
    try {
      await this.run(job);
    } catch (err) {
      if (!job.cancelled && !this.closed) {
        this.ctx.log(`Family computation failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
        await this.finish(job.revisionId, 'failed', err instanceof Error ? err.message : String(err)).catch(() => {});
      }
    } finally {
      this.current = undefined;
      void this.pump();
    }
  }

  private async finish(revisionId: string, state: ComputeState, error: string | null = null): Promise<void> {
    await this.ctx.db
      .update(familyRevisions)
      .set({ computeState: state, computeError: error, computeFinishedAt: new Date(), updatedAt: new Date() })
      .where(eq(familyRevisions.id, revisionId));
    this.emit(revisionId, await this.progressOf(revisionId), true);
  }

  private async run(job: QueuedJob): Promise<void> {
    const started = await this.progressOf(job.revisionId);
    this.emit(job.revisionId, { ...started, state: 'running' }, false);
    const finished = await computeRevision(this.ctx.db, job.revisionId, {
      geometry: (templateId, params) => this.worker.compute(templateId, params),
      isCancelled: () => job.cancelled || this.closed,
      onVariant: (doneCount, total, variant) =>
        this.emit(
          job.revisionId,
          { familyId: started.familyId, revision: started.revision, state: 'running', doneCount, total, variant },
          false,
        ),
    });
    if (finished) this.emit(job.revisionId, await this.progressOf(job.revisionId), true);
  }
}

const runners = new WeakMap<object, FamilyRunner>();

/**
 * The family runner of an app context (created on first use): per-variant jobs on the shared queue when the app
 * runs on PostgreSQL with pg-boss, else the in-process runner.
 * @param ctx - the app context
 */
export function familyJobs(ctx: Pick<AppContext, 'db' | 'log'> & Partial<AppContext>): FamilyRunner {
  let runner = runners.get(ctx);
  if (!runner) {
    runner = ctx.jobs?.kind === 'pg-boss' ? new QueuedFamilyRunner(ctx as AppContext) : new FamilyJobRunner(ctx);
    runners.set(ctx, runner);
  }
  return runner;
}
