/** A revision's compute progress as stored (shared by both family runners). */
import { eq } from 'drizzle-orm';
import type { ComputeProgressEvent } from '../../shared/schemas/variant';
import type { Db } from '../db/client';
import { familyRevisions } from '../db/schema';

/**
 * Reads a revision's compute state and counts as a progress event.
 * @param db - database
 * @param revisionId - the revision
 * @returns its family, number, state, variants done and total
 * @throws Error when there is no such revision
 */
export async function readComputeProgress(db: Db, revisionId: string): Promise<ComputeProgressEvent> {
  const [row] = await db
    .select({
      familyId: familyRevisions.familyId,
      revision: familyRevisions.number,
      state: familyRevisions.computeState,
      doneCount: familyRevisions.computeDone,
      total: familyRevisions.computeTotal,
    })
    .from(familyRevisions)
    .where(eq(familyRevisions.id, revisionId));
  if (!row) throw new Error(`No revision ${revisionId}`);
  return row;
}
