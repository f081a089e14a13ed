/** Workflow steps on a family (submit, approve, return, publish, retire) with their audit events and e-mails. */
import { and, eq, inArray, sql } from 'drizzle-orm';
import { FAMILY_TRANSITIONS, transitionRefusal } from '../../../shared/families/familyWorkflow';
import type { Person } from '../../../shared/schemas/auth';
import type { FamilyAction } from '../../../shared/schemas/familySpec';
import type { ReviewComment } from '../../../shared/schemas/review';
import type { Family } from '../../../shared/schemas/family';
import type { Queryable } from '../../db/client';
import { familyRevisions, families, people } from '../../db/schema';
import { HttpError } from '../../http/HttpError';
import { queueMail } from '../../mail/queueMail';
import { recordAudit } from '../audit';
import { catalogueChanged } from '../catalogueCache';
import { gateOf } from '../familyView';
import { kickMail } from '../mailService';
import { familySubject, invalidState, loadFamily, stateChanged, viewFamily, type FamilyContext } from './loadFamily';

/** Options of a workflow step. */
export interface TransitionInput {
  expectedRevision?: number;
  expectedLock?: number;
  /** Reviewer's comment (approve) or required comments (return). */
  comment?: string;
}

async function emailsOfRole(db: Queryable, role: 'catalogue_manager'): Promise<string[]> {
  const rows = await db
    .select({ email: people.email })
    .from(people)
    .where(sql`${role} = any(${people.roles})`);
  return rows.map((row) => row.email);
}

async function emailsOf(db: Queryable, ids: Array<string | null>): Promise<string[]> {
  const wanted = [...new Set(ids.filter((id): id is string => Boolean(id)))];
  if (wanted.length === 0) return [];
  const rows = await db.select({ email: people.email }).from(people).where(inArray(people.id, wanted));
  return rows.map((row) => row.email);
}

/**
 * A workflow step on a family: submit (designer, gate must pass), approve, return, publish, retire (catalogue
 * managers). The state is changed by a conditional update on the state and lock seen, inside one transaction with
 * the audit event and the queued e-mail: of two reviewers acting at once one wins and the other gets 409.
 * @param ctx - app context
 * @param person - who acts (the route has checked the role)
 * @param id - family id
 * @param action - the step
 * @param input - guards and comment
 * @throws 409 `invalid_state` when the state does not allow the step, `state_changed` when someone acted first,
 *   `gate_failed` (details: the gate) when a submit is blocked
 */
export async function transitionFamily(
  ctx: FamilyContext,
  person: Person,
  id: string,
  action: FamilyAction,
  input: TransitionInput = {},
): Promise<Family> {
  const transition = FAMILY_TRANSITIONS[action];
  await ctx.db.transaction(async (tx) => {
    const { family, current } = await loadFamily(tx, id);
    if (input.expectedRevision !== undefined && input.expectedRevision !== family.currentRevision) throw stateChanged();
    let target = current;
    if (action === 'retire') {
      if (family.publishedRevision === null)
        throw invalidState('cannot retire a family that has no published revision');
      const [published] = await tx
        .select()
        .from(familyRevisions)
        .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, family.publishedRevision)));
      target = published;
    }
    const refusal = transitionRefusal(action, target.state);
    if (refusal) throw invalidState(refusal);
    if (input.expectedLock !== undefined && input.expectedLock !== target.lock) throw stateChanged();
    if (action === 'submit') {
      const gate = await gateOf(tx, target);
      if (!gate.ok) {
        throw new HttpError(
          409,
          'gate_failed',
          `cannot submit: ${gate.blockers.map((b) => b.message).join('; ')}`,
          gate,
        );
      }
    }
    const now = new Date();
    const comments: ReviewComment[] = [...target.comments];
    if (input.comment) {
      comments.push({ action, text: input.comment, by: { id: person.id, name: person.name }, at: now.toISOString() });
    }
    const stamps =
      action === 'submit'
        ? { submittedAt: now }
        : action === 'approve'
          ? { approvedAt: now }
          : action === 'publish'
            ? { publishedAt: now }
            : action === 'retire'
              ? { retiredAt: now }
              : {};
    const [updated] = await tx
      .update(familyRevisions)
      .set({ state: transition.to, comments, lock: sql`${familyRevisions.lock} + 1`, updatedAt: now, ...stamps })
      .where(
        and(
          eq(familyRevisions.id, target.id),
          eq(familyRevisions.state, target.state),
          eq(familyRevisions.lock, target.lock),
        ),
      )
      .returning({ id: familyRevisions.id });
    if (!updated) throw stateChanged();

    if (action === 'publish') {
      if (family.publishedRevision !== null && family.publishedRevision !== target.number) {
        await tx
          .update(familyRevisions)
          .set({ state: 'retired', retiredAt: now, lock: sql`${familyRevisions.lock} + 1`, updatedAt: now })
          .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, family.publishedRevision)));
      }
      await tx.update(families).set({ publishedRevision: target.number, updatedAt: now }).where(eq(families.id, id));
    } else if (action === 'retire') {
      await tx.update(families).set({ publishedRevision: null, updatedAt: now }).where(eq(families.id, id));
    } else {
      await tx.update(families).set({ updatedAt: now }).where(eq(families.id, id));
    }
    await recordAudit(tx, {
      actorId: person.id,
      action: transition.audit,
      subject: familySubject(id),
      details: {
        revision: target.number,
        from: target.state,
        to: transition.to,
        ...(input.comment ? { comment: input.comment } : {}),
        ...(action === 'publish' && family.publishedRevision ? { replaces: family.publishedRevision } : {}),
      },
    });
    const link = `${ctx.env.PUBLIC_ORIGIN ?? ''}/families/${id}`;
    const title = `${target.name} (${family.code}) revision ${target.number}`;
    if (action === 'submit') {
      await queueMail(tx, {
        to: await emailsOfRole(tx, 'catalogue_manager'),
        subject: `Review requested: ${title}`,
        text: `${person.name} submitted ${title} for review: ${target.computeTotal} variants, all through the family gate.\n\nReview it: ${link}\n`,
      });
    } else if (action === 'approve' || action === 'return') {
      const verb = action === 'approve' ? 'Approved' : 'Sent back';
      const note = input.comment ? `\n\nComments from ${person.name}:\n${input.comment}\n` : '\n';
      await queueMail(tx, {
        to: await emailsOf(tx, [family.ownerId, target.createdBy]),
        subject: `${verb}: ${title}`,
        text: `${person.name} ${action === 'approve' ? 'approved' : 'sent back'} ${title}.${note}\n${link}\n`,
      });
    }
  });
  // A publish or a retire changes the catalogue and the shop; any step changes what the family shows.
  catalogueChanged(ctx.db);
  kickMail(ctx);
  return viewFamily(ctx, id, person);
}
