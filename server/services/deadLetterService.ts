/**
 * Jobs that failed their last attempt, as admins handle them: list them, send one again (a new job with the same
 * payload), or discard it. Both write the audit log; a dead letter is handled once (409 after that).
 */
import { and, count, desc, eq, isNotNull, isNull } from 'drizzle-orm';
import type { DeadLetter, DeadLettersQuery, DeadLettersResponse } from '../../shared/schemas/jobs';
import type { AppContext } from '../context';
import { jobDeadLetters, people, type DeadLetterResolution, type JobDeadLetterRow } from '../db/schema';
import { conflict, HttpError, notFound } from '../http/HttpError';
import { jobNamed } from '../jobs/jobRegistry';
import { recordAudit } from './audit';

/** Most dead letters one list shows. */
const LIST_LIMIT = 200;

function toDeadLetter(row: JobDeadLetterRow, resolvedByName: string | null): DeadLetter {
  const job = jobNamed(row.jobName);
  return {
    id: row.id,
    jobName: row.jobName,
    title: job?.title ?? row.jobName,
    jobId: row.jobId,
    data: row.data,
    error: row.error,
    attempts: row.attempts,
    failedAt: row.failedAt.toISOString(),
    resolution: row.resolution ?? null,
    resolvedAt: row.resolvedAt?.toISOString() ?? null,
    resolvedByName,
    retryable: job !== undefined,
  };
}

/**
 * The dead letters waiting for an admin, or those already handled, newest first.
 * @param ctx - app context
 * @param query - which ones
 */
export async function listDeadLetters(ctx: AppContext, query: DeadLettersQuery): Promise<DeadLettersResponse> {
  const rows = await ctx.db
    .select({ row: jobDeadLetters, resolvedByName: people.name })
    .from(jobDeadLetters)
    .leftJoin(people, eq(people.id, jobDeadLetters.resolvedById))
    .where(query.show === 'waiting' ? isNull(jobDeadLetters.resolution) : isNotNull(jobDeadLetters.resolution))
    .orderBy(query.show === 'waiting' ? desc(jobDeadLetters.failedAt) : desc(jobDeadLetters.resolvedAt))
    .limit(LIST_LIMIT);
  const [waiting] = await ctx.db.select({ n: count() }).from(jobDeadLetters).where(isNull(jobDeadLetters.resolution));
  return {
    deadLetters: rows.map(({ row, resolvedByName }) => toDeadLetter(row, resolvedByName)),
    waitingCount: waiting.n,
  };
}

/** Marks a waiting dead letter handled; 404 when there is none, 409 when somebody handled it already. */
async function claim(
  ctx: AppContext,
  id: number,
  resolution: DeadLetterResolution,
  actorId: string,
): Promise<JobDeadLetterRow> {
  const [claimed] = await ctx.db
    .update(jobDeadLetters)
    .set({ resolution, resolvedAt: new Date(), resolvedById: actorId })
    .where(and(eq(jobDeadLetters.id, id), isNull(jobDeadLetters.resolution)))
    .returning();
  if (claimed) return claimed;
  const [existing] = await ctx.db.select().from(jobDeadLetters).where(eq(jobDeadLetters.id, id));
  if (!existing) throw notFound('No such failed job.');
  throw conflict(
    'already_handled',
    `This failed job was already ${existing.resolution === 'retried' ? 'sent again' : 'discarded'}.`,
  );
}

async function withName(ctx: AppContext, row: JobDeadLetterRow): Promise<DeadLetter> {
  const [person] = row.resolvedById
    ? await ctx.db.select({ name: people.name }).from(people).where(eq(people.id, row.resolvedById))
    : [];
  return toDeadLetter(row, person?.name ?? null);
}

/**
 * Sends a failed job again with its payload (a new job, keyed by the dead letter so a double click queues one).
 * 409 when this version no longer has the job type or its payload no longer fits it.
 * @param ctx - app context
 * @param id - the dead letter
 * @param actorId - the admin
 */
export async function retryDeadLetter(ctx: AppContext, id: number, actorId: string): Promise<DeadLetter> {
  const [row] = await ctx.db.select().from(jobDeadLetters).where(eq(jobDeadLetters.id, id));
  if (!row) throw notFound('No such failed job.');
  const job = jobNamed(row.jobName);
  if (!job)
    throw conflict('unknown_job', `This version of Nestwright has no "${row.jobName}" jobs any more; discard it.`);
  const parsed = job.data.safeParse(row.data);
  if (!parsed.success)
    throw conflict('stale_job', 'What this job was sent with no longer fits this version of Nestwright; discard it.');
  const claimed = await claim(ctx, id, 'retried', actorId);
  try {
    await ctx.jobs.send(job, parsed.data, { key: `retry:${id}` });
  } catch (err) {
    // Not queued: the dead letter waits again.
    await ctx.db
      .update(jobDeadLetters)
      .set({ resolution: null, resolvedAt: null, resolvedById: null })
      .where(eq(jobDeadLetters.id, id));
    ctx.log(`Could not send ${row.jobName} again: ${err instanceof Error ? err.message : String(err)}`);
    throw new HttpError(503, 'queue_unavailable', 'The job could not be queued right now. Try again in a minute.');
  }
  await recordAudit(ctx.db, {
    actorId,
    action: 'job.retried',
    subject: `dead-letter:${id}`,
    details: { jobName: row.jobName, jobId: row.jobId },
  });
  return withName(ctx, claimed);
}

/**
 * Discards a failed job: it stays listed under "handled" and is not run again.
 * @param ctx - app context
 * @param id - the dead letter
 * @param actorId - the admin
 */
export async function discardDeadLetter(ctx: AppContext, id: number, actorId: string): Promise<DeadLetter> {
  const claimed = await claim(ctx, id, 'discarded', actorId);
  await recordAudit(ctx.db, {
    actorId,
    action: 'job.discarded',
    subject: `dead-letter:${id}`,
    details: { jobName: claimed.jobName, jobId: claimed.jobId },
  });
  return withName(ctx, claimed);
}
