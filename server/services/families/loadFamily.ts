/** Loading a family and its current revision, the family's audit subject and the workflow's 409 errors. */
import { and, eq } from 'drizzle-orm';
import type { Person } from '../../../shared/schemas/auth';
import type { Family } from '../../../shared/schemas/family';
import type { AppContext } from '../../context';
import type { Queryable } from '../../db/client';
import { familyRevisions, families, type FamilyRevisionRow, type FamilyRow } from '../../db/schema';
import { conflict, HttpError, notFound } from '../../http/HttpError';
import { familyView } from '../familyView';

/** What the family operations use of the app context (the seed step passes a context without sessions). */
export type FamilyContext = Pick<AppContext, 'db' | 'env' | 'log'>;

/** Audit subject of a family. @param id - family id */
export const familySubject = (id: string): string => `family:${id}`;

/** A 409 `invalid_state` naming why the state refuses the step. @param message - the reason */
export function invalidState(message: string): HttpError {
  return conflict('invalid_state', message);
}

/** A 409 `state_changed`: someone else acted first. */
export function stateChanged(): HttpError {
  return conflict(
    'state_changed',
    'the family changed while you were looking at it (someone else acted first); reload and try again',
  );
}

/**
 * A family row and its current revision row.
 * @param db - database or transaction
 * @param id - family id
 * @throws 404 when there is no such family
 */
export async function loadFamily(
  db: Queryable,
  id: string,
): Promise<{ family: FamilyRow; current: FamilyRevisionRow }> {
  const [family] = await db.select().from(families).where(eq(families.id, id));
  if (!family) throw notFound('No such family.');
  const [current] = await db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, family.currentRevision)));
  if (!current) throw new Error(`Family ${id} has no revision ${family.currentRevision}`);
  return { family, current };
}

/**
 * A family in the API shape, as the person sees it.
 * @param ctx - app context
 * @param id - family id
 * @param person - the signed-in person
 * @throws 404 when there is no such family
 */
export async function viewFamily(ctx: FamilyContext, id: string, person: Person): Promise<Family> {
  const family = await familyView(ctx.db, id, person);
  if (!family) throw notFound('No such family.');
  return family;
}
