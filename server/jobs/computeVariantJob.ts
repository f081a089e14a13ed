/**
 * The `family.variant` job (PostgreSQL): builds, evaluates and stores one variant of a family revision, so that N
 * worker processes share one family. Safe to run twice: the variant row is written only while it is still pending
 * and the revision's computation generation is the one the job was sent for, in one transaction that also counts
 * it and announces the progress (NOTIFY, delivered on commit). After the last variant the job that stored it adds the
 * production-target drivers (which parameter moves a missed target most) and then marks the revision done; when
 * that job dies in between, its retry finds every variant stored and finishes the revision.
 */
import { and, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { ComputeProgressEvent } from '../../shared/schemas/variant';
import type { AppContext } from '../context';
import type { Db } from '../db/client';
import { familyComputeRuns, familyRevisions, familyVariants, families } from '../db/schema';
import {
  addRevisionTargetDrivers,
  evaluatedUpdate,
  failedUpdate,
  loadRevisionInputs,
  type RevisionInputs,
  type VariantUpdate,
} from './computeRevision';
import { defineJob } from './JobQueue';
import type { VariantGeometry } from './variantGeometry';
import { VARIANT_TIME_LIMIT_SEC, VariantWorker } from './VariantWorker';

/** The NOTIFY channel of family progress. */
export const FAMILY_PROGRESS_CHANNEL = 'family_progress';

/** A progress message between processes. */
export interface ProgressMessage {
  revisionId: string;
  event: ComputeProgressEvent;
  done: boolean;
}

/** Payload of a variant job. */
export const ComputeVariantDataSchema = z.object({
  revisionId: z.string(),
  variantId: z.string(),
  /** The computation generation it was sent for (`family_compute_runs.generation`). */
  generation: z.number().int(),
});

/** Per process: the worker thread and the geometry of recent parameter sets (variants often share one). */
const workers = new WeakMap<object, { thread: VariantWorker; geometries: Map<string, Promise<VariantGeometry>> }>();
const GEOMETRY_CACHE_SIZE = 32;

function geometryOf(ctx: AppContext, templateId: string, params: Record<string, unknown>): Promise<VariantGeometry> {
  let worker = workers.get(ctx);
  if (!worker) {
    worker = { thread: new VariantWorker(), geometries: new Map() };
    workers.set(ctx, worker);
  }
  const key = `${templateId}|${JSON.stringify(params)}`;
  let pending = worker.geometries.get(key);
  if (!pending) {
    pending = worker.thread.compute(templateId, params);
    const cache = worker.geometries;
    cache.set(key, pending);
    pending.catch(() => cache.delete(key));
    if (cache.size > GEOMETRY_CACHE_SIZE) cache.delete(cache.keys().next().value!);
  }
  return pending;
}

/**
 * Stops the variant worker thread of an app (worker shutdown).
 * @param ctx - the app context
 */
export async function closeVariantWorker(ctx: AppContext): Promise<void> {
  const worker = workers.get(ctx);
  workers.delete(ctx);
  await worker?.thread.close();
}

/**
 * Sends a progress message to every API process (inside a transaction it goes out on commit).
 * @param db - the database or the transaction
 * @param message - what happened
 */
export async function notifyProgress(db: Pick<Db, 'execute'>, message: ProgressMessage): Promise<void> {
  await db.execute(sql`select pg_notify(${FAMILY_PROGRESS_CHANNEL}, ${JSON.stringify(message)})`);
}

/** Builds, evaluates and stores one variant; see the file comment. */
export const computeVariantJob = defineJob({
  name: 'family.variant',
  title: 'Computing one variant of a family',
  data: ComputeVariantDataSchema,
  retry: { limit: 3, delaySec: 2, backoff: true },
  timeLimitSec: VARIANT_TIME_LIMIT_SEC,
  async handler({ revisionId, variantId, generation }, { ctx, attempt, signal }) {
    const { db } = ctx;
    // A build past the time limit is stopped with its thread; the next job starts a new one.
    signal.addEventListener('abort', () => void closeVariantWorker(ctx), { once: true });
    const current = async () =>
      (
        await db
          .select({ generation: familyComputeRuns.generation })
          .from(familyComputeRuns)
          .where(eq(familyComputeRuns.revisionId, revisionId))
      )[0]?.generation === generation;
    const [variant] = await db.select().from(familyVariants).where(eq(familyVariants.id, variantId));
    if (!variant || !(await current())) return;
    const inputs = await loadRevisionInputs(db, revisionId);
    if (!inputs) return;
    if (variant.status !== 'pending') {
      // A retry after the job died between storing the last variant and finishing the revision.
      const { revision } = inputs;
      if (revision.computeState === 'running' && revision.computeDone >= revision.computeTotal)
        await finishRevision(ctx, inputs, generation);
      return;
    }
    await db
      .update(familyRevisions)
      .set({ computeState: 'running', computeStartedAt: new Date(), updatedAt: new Date() })
      .where(and(eq(familyRevisions.id, revisionId), eq(familyRevisions.computeState, 'queued')));

    let update: VariantUpdate;
    try {
      update = evaluatedUpdate(inputs, variant, await geometryOf(ctx, inputs.revision.templateId, variant.params));
    } catch (err) {
      // A template that cannot build this variant is a result, not a job failure; a worker problem is retried,
      // and on the last attempt the variant is stored as failed so the family still completes.
      if (!isBuildFailure(err) && attempt <= computeVariantJob.retry.limit) throw err;
      update = failedUpdate(err);
    }
    const last = await storeVariant(db, { revisionId, variantId, generation }, update, variant.sku);
    if (last) await finishRevision(ctx, inputs, generation);
  },
});

function isBuildFailure(err: unknown): boolean {
  const message = err instanceof Error ? err.message : '';
  return !/computation (worker )?(was )?stopped|worker stopped/.test(message);
}

/**
 * Writes a computed variant once, counts it and announces it.
 * @returns true when it was the revision's last variant
 */
async function storeVariant(
  db: Db,
  job: z.infer<typeof ComputeVariantDataSchema>,
  update: VariantUpdate,
  sku: string,
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [run] = await tx
      .select({ generation: familyComputeRuns.generation })
      .from(familyComputeRuns)
      .where(eq(familyComputeRuns.revisionId, job.revisionId))
      .for('update');
    if (run?.generation !== job.generation) return false;
    const stored = await tx
      .update(familyVariants)
      .set({ ...update, updatedAt: new Date() })
      .where(and(eq(familyVariants.id, job.variantId), eq(familyVariants.status, 'pending')))
      .returning({ id: familyVariants.id });
    if (stored.length === 0) return false;
    const [revision] = await tx
      .update(familyRevisions)
      .set({ computeDone: sql`${familyRevisions.computeDone} + 1`, updatedAt: new Date() })
      .where(eq(familyRevisions.id, job.revisionId))
      .returning();
    const base = { familyId: revision.familyId, revision: revision.number, total: revision.computeTotal };
    await notifyProgress(tx, {
      revisionId: job.revisionId,
      event: { ...base, state: 'running', doneCount: revision.computeDone, variant: { sku, verdict: update.verdict } },
      done: false,
    });
    return revision.computeDone >= revision.computeTotal;
  });
}

/**
 * Finishes a revision whose variants are all stored: adds the production-target drivers (a failure there leaves the
 * messages without a driver, and is logged), then marks the revision done and announces it, once and only for the
 * generation the job was sent for.
 */
async function finishRevision(ctx: AppContext, inputs: RevisionInputs, generation: number): Promise<void> {
  const { db } = ctx;
  const revisionId = inputs.revision.id;
  try {
    await addRevisionTargetDrivers(db, inputs, (params) => geometryOf(ctx, inputs.revision.templateId, params));
  } catch (err) {
    ctx.log(`Family ${revisionId}: the target drivers could not be worked out (${(err as Error).message})`);
  }
  await db.transaction(async (tx) => {
    const [run] = await tx
      .select({ generation: familyComputeRuns.generation })
      .from(familyComputeRuns)
      .where(eq(familyComputeRuns.revisionId, revisionId))
      .for('update');
    if (run?.generation !== generation) return;
    const now = new Date();
    const [revision] = await tx
      .update(familyRevisions)
      .set({ computeState: 'done', computeError: null, computeFinishedAt: now, updatedAt: now })
      .where(and(eq(familyRevisions.id, revisionId), eq(familyRevisions.computeState, 'running')))
      .returning();
    if (!revision) return;
    await tx.update(families).set({ updatedAt: now }).where(eq(families.id, revision.familyId));
    await notifyProgress(tx, {
      revisionId,
      event: {
        familyId: revision.familyId,
        revision: revision.number,
        total: revision.computeTotal,
        state: 'done',
        doneCount: revision.computeDone,
      },
      done: true,
    });
  });
}
