/**
 * The PostgreSQL back end of {@link JobQueue}: pg-boss 10 (the last major that runs on Node 20). Jobs live in the
 * `pgboss` schema of the same database, so any process on any machine can send them and any worker can run them;
 * a job held by a worker that dies is taken back when its time limit passes (pg-boss supervision) and retried.
 *
 * Mapping: one pg-boss queue per job type with policy `stately` (at most one waiting job per key; a send without a
 * key gets a random one), the definition's retry policy and time limit (`expireInSeconds`), and a shared
 * dead-letter queue. Whatever reaches the dead-letter queue (a last attempt failing in a handler, or timing out in
 * a worker that died) is copied into `job_dead_letters`, the table admins see on either back end.
 */
import { randomUUID } from 'node:crypto';
import PgBoss from 'pg-boss';
import type { AppContext } from '../context';
import { jobDeadLetters } from '../db/schema';
import type { AnyJobDefinition, JobDefinition, JobQueue, SendOptions } from './JobQueue';
import { withTimeLimit } from './jobTiming';
import { PERIODIC_KEY } from './InProcessJobQueue';

/** The queue failed jobs are moved to after their last attempt. */
export const DEAD_LETTER_QUEUE = 'nestwright.dead-letter';

/** What pg-boss stores as a job's data: the job type travels along so a dead letter still names it. */
interface Envelope {
  job: string;
  data: unknown;
}

/** Settings of {@link PgBossJobQueue}. */
export interface PgBossJobQueueOptions {
  /** The PostgreSQL URL (DATABASE_URL). */
  url: string;
  /** Connections pg-boss keeps (its own small pool). */
  poolMax?: number;
  /** How often a worker looks for new jobs (seconds, at least 0.5). */
  pollSec?: number;
  /** How often pg-boss supervises (expires jobs of dead workers, archives); seconds. */
  maintenanceSec?: number;
  /** Name in `pg_stat_activity`. */
  applicationName?: string;
}

/** pg-boss behind {@link JobQueue}; see the file comment. */
export class PgBossJobQueue implements JobQueue {
  readonly kind = 'pg-boss' as const;
  private readonly boss: PgBoss;
  private starting: Promise<void> | undefined;
  private readonly queues = new Map<string, Promise<void>>();
  private readonly working = new Set<string>();
  private readonly running = new Set<{ abort: AbortController; done: Promise<unknown> }>();
  private stopped = false;

  /**
   * @param ctx - the app context handlers receive (read when a job runs)
   * @param options - connection and timing settings
   */
  constructor(
    private readonly ctx: () => AppContext,
    private readonly options: PgBossJobQueueOptions,
  ) {
    this.boss = new PgBoss({
      connectionString: options.url,
      max: options.poolMax ?? 4,
      application_name: options.applicationName ?? 'nestwright jobs',
      maintenanceIntervalSeconds: options.maintenanceSec ?? 30,
    });
    this.boss.on('error', (err) => this.ctx().log(`Job queue: ${err.message}`));
  }

  /** Installs or upgrades the pg-boss schema (under pg-boss's own lock) and starts supervision. */
  start(): Promise<void> {
    this.starting ??= (async () => {
      await this.boss.start();
      await this.createQueueOnce(DEAD_LETTER_QUEUE, { name: DEAD_LETTER_QUEUE, policy: 'standard', retryLimit: 5 });
    })();
    return this.starting;
  }

  async send<T>(job: JobDefinition<T>, data: T, options: SendOptions = {}): Promise<string | null> {
    const parsed = job.data.parse(data);
    if (this.stopped) return null;
    await this.ensureQueue(job);
    const envelope: Envelope = { job: job.name, data: parsed };
    return this.boss.send(job.name, envelope as unknown as object, {
      singletonKey: options.key ?? randomUUID(),
      ...(options.startAfterSec ? { startAfter: Math.max(1, Math.ceil(options.startAfterSec)) } : {}),
    });
  }

  async work(jobs: readonly AnyJobDefinition[]): Promise<void> {
    await this.workDeadLetters();
    for (const job of jobs) {
      if (this.working.has(job.name)) continue;
      this.working.add(job.name);
      await this.ensureQueue(job);
      for (let i = 0; i < (job.concurrency ?? 1); i++)
        await this.boss.work<Envelope>(
          job.name,
          { batchSize: 1, pollingIntervalSeconds: this.options.pollSec ?? 1 },
          async ([received]) => this.run(job, received),
        );
      if (job.everySec !== undefined) {
        const minutes = Math.max(1, Math.ceil(job.everySec / 60));
        const cron = minutes === 1 ? '* * * * *' : `*/${minutes} * * * *`;
        await this.boss.schedule(job.name, cron, { job: job.name, data: {} } satisfies Envelope, {
          singletonKey: PERIODIC_KEY,
        });
      }
    }
  }

  async drain(): Promise<void> {
    const names = [...this.working];
    for (;;) {
      const { rows } = await this.ctx().pg.query<{ n: number }>(
        `select count(*)::int as n from pgboss.job
          where name = any($1) and (state = 'active' or (state in ('created', 'retry') and start_after <= now()))`,
        [names],
      );
      if (rows[0].n === 0 && this.running.size === 0) return;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }

  async stop(): Promise<void> {
    if (this.stopped) return;
    this.stopped = true;
    for (const run of this.running) run.abort.abort(new Error('the job queue stopped'));
    await Promise.allSettled([...this.running].map((run) => run.done));
    if (this.starting) await this.boss.stop({ graceful: true, wait: true, timeout: 5000 }).catch(() => {});
  }

  /** Creates the pg-boss queue of a job type once per process (idempotent in the database too). */
  private ensureQueue(job: AnyJobDefinition): Promise<void> {
    let ready = this.queues.get(job.name);
    if (!ready) {
      const settings: PgBoss.Queue = {
        name: job.name,
        policy: 'stately',
        retryLimit: job.retry.limit,
        retryDelay: Math.max(1, Math.round(job.retry.delaySec)),
        retryBackoff: job.retry.backoff,
        expireInSeconds: Math.max(1, Math.ceil(job.timeLimitSec)),
        deadLetter: DEAD_LETTER_QUEUE,
      };
      ready = (async () => {
        await this.start();
        await this.createQueueOnce(job.name, settings);
        await retryOnDeadlock(() => this.boss.updateQueue(job.name, settings));
      })();
      ready.catch(() => this.queues.delete(job.name));
      this.queues.set(job.name, ready);
    }
    return ready;
  }

  /**
   * Creates a queue unless it exists. Creating one attaches a partition to pg-boss's job table; processes that
   * start together and create different queues at once can deadlock in PostgreSQL, so the loser tries again.
   */
  private async createQueueOnce(name: string, settings: PgBoss.Queue): Promise<void> {
    await retryOnDeadlock(async () => {
      if (!(await this.boss.getQueue(name))) await this.boss.createQueue(name, settings);
    });
  }

  /** One attempt of a job, aborted at its time limit (pg-boss also fails it then, and retries it). */
  private async run(job: AnyJobDefinition, received: PgBoss.Job<Envelope>): Promise<void> {
    const abort = new AbortController();
    const ctx = this.ctx();
    const attempt = await this.attemptOf(job.name, received.id);
    const done = withTimeLimit(job.timeLimitSec, abort, (signal) =>
      job.handler(job.data.parse(received.data.data), { ctx, signal, attempt, jobId: received.id }),
    );
    const entry = { abort, done };
    this.running.add(entry);
    try {
      await done;
    } catch (err) {
      ctx.log(`Job ${job.name} failed (attempt ${attempt}): ${err instanceof Error ? err.message : String(err)}`);
      throw err;
    } finally {
      this.running.delete(entry);
    }
  }

  private async attemptOf(name: string, id: string): Promise<number> {
    const found = await this.boss.getJobById(name, id).catch(() => null);
    return (found?.retryCount ?? 0) + 1;
  }

  /** Copies jobs that reached the dead-letter queue into `job_dead_letters` (once per process that works jobs). */
  private async workDeadLetters(): Promise<void> {
    if (this.working.has(DEAD_LETTER_QUEUE)) return;
    this.working.add(DEAD_LETTER_QUEUE);
    await this.start();
    await this.boss.work<Envelope>(
      DEAD_LETTER_QUEUE,
      { batchSize: 10, pollingIntervalSeconds: 2, includeMetadata: true },
      async (letters) => {
        for (const letter of letters) {
          const output = letter.output as { message?: string; value?: { message?: string } } | null;
          const message = output?.message ?? output?.value?.message ?? 'the job failed or ran past its time limit';
          // Idempotent: a letter copied twice (worker died between insert and completion) keeps one row.
          await this.ctx()
            .db.insert(jobDeadLetters)
            .values({
              jobName: letter.data.job,
              jobId: letter.id,
              data: letter.data.data ?? null,
              error: message,
              attempts: letter.retryLimit + 1,
            })
            .onConflictDoNothing();
        }
      },
    );
  }
}

/** PostgreSQL's error code for a transaction chosen as a deadlock victim. */
const DEADLOCK_DETECTED = '40P01';

/** Runs `work` again (after a short random pause) when PostgreSQL ends it as a deadlock victim; at most 8 tries. */
async function retryOnDeadlock<R>(work: () => Promise<R>): Promise<R> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if ((err as { code?: string }).code !== DEADLOCK_DETECTED || attempt >= 8) throw err;
      await new Promise((resolve) => setTimeout(resolve, 50 + Math.random() * 200 * attempt));
    }
  }
}
