/** Workflow steps on a family (submit, approve, return, publish, retire) with their audit events and e-mails. */
import { and, eq, inArray, isNull, sql } from 'drizzle-orm';
import { FAMILY_TRANSITIONS, transitionRefusal } from '../../../shared/families/familyWorkflow';
import { publishBlockers, publishRefusal } from '../../../shared/families/publishPolicy';
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
  /** A note with the step: optional for submit, approve, publish and retire; required for return. */
  comment?: string;
  /** Start of the absolute links in the e-mails (server/mail/linkBase.ts); `http://localhost:<PORT>` if absent. */
  linkBase?: string;
}

/** E-mail addresses of the active people holding a role. */
async function emailsOfRole(db: Queryable, role: 'catalogue_manager'): Promise<string[]> {
  const rows = await db
    .select({ email: people.email })
    .from(people)
    .where(and(sql`${role} = any(${people.roles})`, isNull(people.deactivatedAt)));
  return rows.map((row) => row.email);
}

/** E-mail addresses of these people, leaving out anyone deactivated. */
async function emailsOf(db: Queryable, ids: Array<string | null>): Promise<string[]> {
  const wanted = [...new Set(ids.filter((id): id is string => Boolean(id)))];
  if (wanted.length === 0) return [];
  const rows = await db
    .select({ email: people.email })
    .from(people)
    .where(and(inArray(people.id, wanted), isNull(people.deactivatedAt)));
  return rows.map((row) => row.email);
}

/** What the mail of each step says: its subject verb and the sentence's verb. */
const MAIL_VERBS: Record<FamilyAction, { subject: string; past: string }> = {
  submit: { subject: 'Review requested', past: 'submitted' },
  approve: { subject: 'Approved', past: 'approved' },
  return: { subject: 'Sent back', past: 'sent back' },
  publish: { subject: 'Published', past: 'published' },
  retire: { subject: 'Retired', past: 'retired' },
};

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
    if (action === 'publish') {
      // An acknowledgement gets a family through review; some findings still keep it out of the catalogue
      // (shared/families/publishPolicy.ts; the README's table).
      const blocked = publishBlockers((await gateOf(tx, target)).warnings);
      if (blocked.length > 0) {
        throw new HttpError(409, 'publish_blocked', publishRefusal(blocked), {
          findings: blocked.map((w) => ({ code: w.code, skus: w.skus })),
        });
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
    const base = input.linkBase ?? `http://localhost:${ctx.env.PORT}`;
    const title = `${target.name} (${family.code}) revision ${target.number}`;
    const designers = await emailsOf(tx, [family.ownerId, target.createdBy]);
    // Who hears of each step: managers review what is submitted; the designer hears every decision; publishing
    // and retiring change the catalogue, so the catalogue managers hear of them too.
    const to =
      action === 'submit'
        ? await emailsOfRole(tx, 'catalogue_manager')
        : action === 'approve' || action === 'return'
          ? designers
          : [...new Set([...designers, ...(await emailsOfRole(tx, 'catalogue_manager'))])];
    const { subject, past } = MAIL_VERBS[action];
    const lines = [`${person.name} ${past} ${title}.`];
    if (action === 'submit') lines.push(`${target.computeTotal} variants, all through the family gate.`);
    if (action === 'publish') lines.push(`Its ${target.computeTotal} variants are in the catalogue now.`);
    if (action === 'retire') lines.push('Its variants have left the catalogue; the family and its history stay.');
    if (input.comment) lines.push('', `Note from ${person.name}:`, input.comment);
    // One address for everyone: the client sends a catalogue manager who is not a designer on to the review page.
    lines.push('', `${action === 'submit' ? 'Review it' : 'Open it'}: ${base}/families/${id}`);
    // The person acting knows what they did; everyone else concerned is told.
    const recipients = to.filter((email) => email !== person.email);
    await queueMail(tx, { to: recipients, subject: `${subject}: ${title}`, text: `${lines.join('\n')}\n` });
  });
  // A publish or a retire changes the catalogue and the shop; any step changes what the family shows.
  catalogueChanged(ctx.db);
  kickMail(ctx);
  return viewFamily(ctx, id, person);
}
