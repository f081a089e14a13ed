/** Resetting a revision before it is computed again (shared by both family runners). */
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { familyRevisions, familyVariants } from '../db/schema';

/**
 * Puts every variant of a revision back to pending and marks the revision queued with its variant count (and bumps
 * its optimistic lock), in one transaction.
 * @param db - database
 * @param revisionId - the revision
 * @returns the ids of the variants to compute
 */
export async function resetForCompute(db: Db, revisionId: string): Promise<string[]> {
  return db.transaction(async (tx) => {
    const reset = await tx
      .update(familyVariants)
      .set({
        status: 'pending',
        sha256: null,
        report: null,
        cost: null,
        verdict: null,
        reasons: [],
        birdFitWarnings: [],
        error: null,
      })
      .where(eq(familyVariants.revisionId, revisionId))
      .returning({ id: familyVariants.id, index: familyVariants.index });
    await tx
      .update(familyRevisions)
      .set({
        computeState: 'queued',
        computeDone: 0,
        computeTotal: reset.length,
        computeStartedAt: null,
        computeFinishedAt: null,
        computeError: null,
        lock: sql`${familyRevisions.lock} + 1`,
        updatedAt: new Date(),
      })
      .where(eq(familyRevisions.id, revisionId));
    return reset.sort((a, b) => a.index - b.index).map((row) => row.id);
  });
}
