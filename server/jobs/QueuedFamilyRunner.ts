/**
 * {@link FamilyRunner} on the shared job queue (PostgreSQL + pg-boss): a computation is one `family.variant` job per
 * variant, so every worker process takes part; cancelling moves the revision's generation on, so jobs still queued
 * for it store nothing. Progress travels between processes with PostgreSQL LISTEN/NOTIFY: each API process keeps
 * one listening connection and hands the events to its SSE subscribers, whichever worker computed the variant.
 */
import { EventEmitter } from 'node:events';
import { and, eq, inArray, sql } from 'drizzle-orm';
import pg from 'pg';
import type { ComputeProgressEvent } from '../../shared/schemas/variant';
import type { AppContext } from '../context';
import { familyComputeRuns, familyRevisions } from '../db/schema';
import { computeVariantJob, FAMILY_PROGRESS_CHANNEL, notifyProgress, type ProgressMessage } from './computeVariantJob';
import { resetForCompute } from './resetForCompute';
import { readComputeProgress } from './readComputeProgress';
import type { FamilyRunner, ProgressListener } from './familyRunner';

/** Variant jobs sent at once when a computation starts. */
const SEND_BATCH = 25;

/** See the file comment. */
export class QueuedFamilyRunner implements FamilyRunner {
  private readonly events = new EventEmitter();
  private listener: pg.Client | undefined;
  private listening: Promise<void> | undefined;
  private closed = false;

  /** @param ctx - the app context (database, job queue, DATABASE_URL) */
  constructor(private readonly ctx: AppContext) {
    this.events.setMaxListeners(0);
  }

  async enqueue(revisionId: string): Promise<void> {
    const { db } = this.ctx;
    const variantIds = await resetForCompute(db, revisionId);
    const [{ generation }] = await db
      .insert(familyComputeRuns)
      .values({ revisionId, generation: 1 })
      .onConflictDoUpdate({
        target: familyComputeRuns.revisionId,
        set: { generation: sql`${familyComputeRuns.generation} + 1`, updatedAt: new Date() },
      })
      .returning({ generation: familyComputeRuns.generation });
    for (let i = 0; i < variantIds.length; i += SEND_BATCH)
      await Promise.all(
        variantIds
          .slice(i, i + SEND_BATCH)
          .map((variantId) =>
            this.ctx.jobs.send(
              computeVariantJob,
              { revisionId, variantId, generation },
              { key: `${variantId}:${generation}` },
            ),
          ),
      );
    const event = await this.progressOf(revisionId);
    if (variantIds.length === 0) {
      await db
        .update(familyRevisions)
        .set({ computeState: 'done', computeFinishedAt: new Date() })
        .where(eq(familyRevisions.id, revisionId));
      await notifyProgress(db, { revisionId, event: { ...event, state: 'done' }, done: true });
    } else await notifyProgress(db, { revisionId, event, done: false });
  }

  async cancel(revisionId: string, record = true): Promise<boolean> {
    const { db } = this.ctx;
    const stopped = await db.transaction(async (tx) => {
      const active = await tx
        .select({ id: familyRevisions.id })
        .from(familyRevisions)
        .where(and(eq(familyRevisions.id, revisionId), inArray(familyRevisions.computeState, ['queued', 'running'])))
        .for('update');
      if (active.length === 0) return false;
      await tx
        .update(familyComputeRuns)
        .set({ generation: sql`${familyComputeRuns.generation} + 1`, updatedAt: new Date() })
        .where(eq(familyComputeRuns.revisionId, revisionId));
      if (record)
        await tx
          .update(familyRevisions)
          .set({ computeState: 'cancelled', computeFinishedAt: new Date(), updatedAt: new Date() })
          .where(eq(familyRevisions.id, revisionId));
      return true;
    });
    if (stopped && record)
      await notifyProgress(db, { revisionId, event: await this.progressOf(revisionId), done: true });
    return stopped;
  }

  subscribe(revisionId: string, listener: ProgressListener): () => void {
    void this.listen();
    const handler = (event: ComputeProgressEvent, done: boolean) => listener(event, done);
    this.events.on(revisionId, handler);
    return () => this.events.off(revisionId, handler);
  }

  ready(): Promise<void> {
    return this.listen();
  }

  async isActive(revisionId: string): Promise<boolean> {
    const { state } = await this.progressOf(revisionId);
    return state === 'queued' || state === 'running';
  }

  async progressOf(revisionId: string): Promise<ComputeProgressEvent> {
    return readComputeProgress(this.ctx.db, revisionId);
  }

  async idle(): Promise<void> {
    for (;;) {
      const active = await this.ctx.db
        .select({ id: familyRevisions.id })
        .from(familyRevisions)
        .where(inArray(familyRevisions.computeState, ['queued', 'running']))
        .limit(1);
      if (active.length === 0) return;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }

  async close(): Promise<void> {
    this.closed = true;
    this.events.removeAllListeners();
    const listener = this.listener;
    this.listener = undefined;
    await listener?.end().catch(() => {});
  }

  /** Opens the LISTEN connection once; reconnects after a lost connection. */
  private listen(): Promise<void> {
    if (this.closed) return Promise.resolve();
    this.listening ??= (async () => {
      const url = this.ctx.env.DATABASE_URL;
      if (!url) throw new Error('the queued family runner needs DATABASE_URL');
      const client = new pg.Client({ connectionString: url, application_name: 'nestwright progress' });
      client.on('notification', (message) => {
        if (message.channel !== FAMILY_PROGRESS_CHANNEL || !message.payload) return;
        const { revisionId, event, done } = JSON.parse(message.payload) as ProgressMessage;
        this.events.emit(revisionId, event, done);
      });
      client.on('error', (err) => {
        this.ctx.log(`Family progress: the listening connection failed (${err.message}); reconnecting`);
        this.listening = undefined;
        this.listener = undefined;
        client.end().catch(() => {});
        if (!this.closed) setTimeout(() => void this.listen().catch(() => {}), 1000).unref();
      });
      await client.connect();
      await client.query(`listen ${FAMILY_PROGRESS_CHANNEL}`);
      if (this.closed) await client.end();
      else this.listener = client;
    })();
    this.listening.catch(() => {
      this.listening = undefined;
    });
    return this.listening;
  }
}
