/** Family operations behind /api/families: create, edit (with revisions), compute, acknowledge, review workflow. */
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { z } from 'zod';
import { FAMILY_TRANSITIONS, transitionRefusal } from '../../shared/families/familyWorkflow';
import { buildVariantMatrix } from '../../shared/families/variantMatrix';
import { revisionDiff } from '../../shared/families/revisionDiff';
import type { Person } from '../../shared/schemas/auth';
import type { FamilyAction, FamilyCreateSchema, FamilyUpdate } from '../../shared/schemas/familySpec';
import type { ComputeStatus, VariantListQuery, VariantListResponse } from '../../shared/schemas/variant';
import type { AuditListResponse, ReviewComment, RevisionDiff } from '../../shared/schemas/review';
import type { AcknowledgementsCreate } from '../../shared/schemas/gate';
import type { Family, FamilyListQuery, FamilySummary } from '../../shared/schemas/family';
import { findTemplate, parseParams } from '../../templates/index';
import type { AppContext } from '../context';
import type { Queryable } from '../db/client';
import {
  auditEvents,
  familyAcknowledgements,
  familyRevisions,
  familyVariants,
  families,
  people,
  type FamilyRevisionRow,
  type FamilyRow,
} from '../db/schema';
import { conflict, HttpError, notFound } from '../http/HttpError';
import { familyJobs } from '../jobs/FamilyJobRunner';
import { queueMail } from '../mail/queueMail';
import { recordAudit } from './audit';
import { actorsById, familySummaries, familyView, gateOf, toComputeStatus, toVariant } from './familyView';
import { loadMaterials, loadPrinters } from './familyProduction';
import { checkFamilySpec, type SpecToCheck } from './familySpecCheck';
import { kickMail } from './mailService';

/** Body of create after parsing (defaults applied). */
export type FamilyCreateParsed = z.output<typeof FamilyCreateSchema>;

/** What the family operations use of the app context (the seed step passes a context without sessions). */
export type FamilyContext = Pick<AppContext, 'db' | 'env' | 'log'>;

/** Audit subject of a family. @param id - family id */
export const familySubject = (id: string): string => `family:${id}`;

function invalidState(message: string): HttpError {
  return conflict('invalid_state', message);
}

function stateChanged(): HttpError {
  return conflict(
    'state_changed',
    'the family changed while you were looking at it (someone else acted first); reload and try again',
  );
}

async function loadFamily(db: Queryable, id: string): Promise<{ family: FamilyRow; current: FamilyRevisionRow }> {
  const [family] = await db.select().from(families).where(eq(families.id, id));
  if (!family) throw notFound('No such family.');
  const [current] = await db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, family.currentRevision)));
  if (!current) throw new Error(`Family ${id} has no revision ${family.currentRevision}`);
  return { family, current };
}

async function view(ctx: FamilyContext, id: string, person: Person): Promise<Family> {
  const family = await familyView(ctx.db, id, person);
  if (!family) throw notFound('No such family.');
  return family;
}

/** Inserts the variant rows of a revision's matrix (parameters merged with the template defaults). */
async function insertVariants(db: Queryable, revisionId: string, code: string, spec: SpecToCheck): Promise<number> {
  const template = findTemplate(spec.templateId);
  if (!template) throw new Error(`unknown template ${spec.templateId}`);
  const cells = buildVariantMatrix({
    familyCode: code,
    axes: spec.axes,
    baseParams: spec.baseParams,
    materialId: spec.materialId,
  });
  const rows = cells.map((cell) => ({
    revisionId,
    index: cell.index,
    sku: cell.sku,
    variantKey: cell.variantKey,
    axisValues: cell.axisValues,
    params: parseParams(template, cell.params),
    attributes: cell.attributes,
  }));
  for (let i = 0; i < rows.length; i += 100) await db.insert(familyVariants).values(rows.slice(i, i + 100));
  return rows.length;
}

/**
 * The id of a family's current revision (progress events are per revision).
 * @param ctx - app context
 * @param id - family id
 * @throws 404 when there is no such family
 */
export async function currentRevisionId(ctx: FamilyContext, id: string): Promise<string> {
  return (await loadFamily(ctx.db, id)).current.id;
}

/**
 * Families as list rows.
 * @param ctx - app context
 * @param query - state filter and search text
 */
export async function listFamilies(ctx: FamilyContext, query: FamilyListQuery): Promise<FamilySummary[]> {
  const q = query.q?.toLowerCase();
  return (await familySummaries(ctx.db)).filter(
    (family) =>
      (!query.state || family.state === query.state) &&
      (!q || family.name.toLowerCase().includes(q) || family.code.toLowerCase().includes(q)),
  );
}

/**
 * One family. @param ctx - app context @param id - family id @param person - the signed-in person
 * @throws 404 when there is no such family
 */
export function getFamily(ctx: FamilyContext, id: string, person: Person): Promise<Family> {
  return view(ctx, id, person);
}

/**
 * Creates a family in draft (revision 1) with its variant matrix, pinned to the template's current version.
 * @param ctx - app context
 * @param person - the designer
 * @param body - the parsed create body
 * @throws 400 naming the field for bad content, 409 `code_taken` for a code in use
 */
export async function createFamily(ctx: FamilyContext, person: Person, body: FamilyCreateParsed): Promise<Family> {
  const spec = body;
  const { templateVersion } = checkFamilySpec(spec, await loadPrinters(ctx.db), await loadMaterials(ctx.db));
  const id = await ctx.db.transaction(async (tx) => {
    const [taken] = await tx.select({ id: families.id }).from(families).where(eq(families.code, body.code));
    if (taken) throw conflict('code_taken', `code: another family already uses the code ${body.code}`);
    const [family] = await tx.insert(families).values({ code: body.code, ownerId: person.id }).returning();
    const [revision] = await tx
      .insert(familyRevisions)
      .values({
        familyId: family.id,
        number: 1,
        name: spec.name,
        description: spec.description,
        templateId: spec.templateId,
        templateVersion,
        baseParams: spec.baseParams,
        axes: spec.axes,
        supportBudgetMm3: spec.supportBudgetMm3,
        printerId: spec.printerId,
        materialId: spec.materialId,
        region: spec.region,
        createdBy: person.id,
      })
      .returning();
    const count = await insertVariants(tx, revision.id, body.code, spec);
    await tx.update(familyRevisions).set({ computeTotal: count }).where(eq(familyRevisions.id, revision.id));
    await recordAudit(tx, {
      actorId: person.id,
      action: 'family.created',
      subject: familySubject(family.id),
      details: { code: body.code, name: spec.name, revision: 1, variants: count },
    });
    return family.id;
  });
  return view(ctx, id, person);
}

/**
 * Edits a family. A draft changes in place (its results are cleared); a published or retired family gets a new draft
 * revision while the published one stays in the catalogue; a family in review or approved cannot change (409).
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 * @param patch - the fields to change
 */
export async function updateFamily(
  ctx: FamilyContext,
  person: Person,
  id: string,
  patch: FamilyUpdate,
): Promise<Family> {
  const printers = await loadPrinters(ctx.db);
  const materials = await loadMaterials(ctx.db);
  const { current: before } = await loadFamily(ctx.db, id);
  if (before.state === 'draft') await familyJobs(ctx).cancel(before.id, false);
  await ctx.db.transaction(async (tx) => {
    const { family, current } = await loadFamily(tx, id);
    if (patch.expectedLock !== undefined && patch.expectedLock !== current.lock) throw stateChanged();
    if (current.state === 'in_review' || current.state === 'approved') {
      throw invalidState(
        `cannot change a family that is ${current.state.replace('_', ' ')}; a catalogue manager must send it back first`,
      );
    }
    const templateChanged = patch.templateId !== undefined && patch.templateId !== current.templateId;
    const spec = {
      name: patch.name ?? current.name,
      description: patch.description ?? current.description,
      templateId: patch.templateId ?? current.templateId,
      baseParams: patch.baseParams ?? current.baseParams,
      axes: patch.axes ?? current.axes,
      supportBudgetMm3: patch.supportBudgetMm3 ?? current.supportBudgetMm3,
      printerId: patch.printerId ?? current.printerId,
      materialId: patch.materialId ?? current.materialId,
      region: patch.region !== undefined ? patch.region : current.region,
    };
    const checked = checkFamilySpec(spec, printers, materials);
    const templateVersion =
      templateChanged || patch.templateVersion === 'latest' ? checked.templateVersion : current.templateVersion;
    const changed = Object.keys(patch).filter((key) => key !== 'expectedLock');
    const reset = {
      computeState: 'idle' as const,
      computeDone: 0,
      computeStartedAt: null,
      computeFinishedAt: null,
      computeError: null,
    };
    if (current.state === 'draft') {
      const [updated] = await tx
        .update(familyRevisions)
        .set({ ...spec, templateVersion, ...reset, lock: sql`${familyRevisions.lock} + 1`, updatedAt: new Date() })
        .where(and(eq(familyRevisions.id, current.id), eq(familyRevisions.lock, current.lock)))
        .returning({ id: familyRevisions.id });
      if (!updated) throw stateChanged();
      await tx.delete(familyVariants).where(eq(familyVariants.revisionId, current.id));
      const count = await insertVariants(tx, current.id, family.code, spec);
      await tx.update(familyRevisions).set({ computeTotal: count }).where(eq(familyRevisions.id, current.id));
      await recordAudit(tx, {
        actorId: person.id,
        action: 'family.updated',
        subject: familySubject(id),
        details: { revision: current.number, fields: changed, variants: count },
      });
      return;
    }
    // Published or retired: open a new draft revision; the published one stays until this one is published.
    const number = family.currentRevision + 1;
    const [moved] = await tx
      .update(families)
      .set({ currentRevision: number, updatedAt: new Date() })
      .where(and(eq(families.id, id), eq(families.currentRevision, family.currentRevision)))
      .returning({ id: families.id });
    if (!moved) throw stateChanged();
    const [revision] = await tx
      .insert(familyRevisions)
      .values({ familyId: id, number, ...spec, templateVersion, createdBy: person.id })
      .returning();
    const count = await insertVariants(tx, revision.id, family.code, spec);
    await tx.update(familyRevisions).set({ computeTotal: count }).where(eq(familyRevisions.id, revision.id));
    await recordAudit(tx, {
      actorId: person.id,
      action: 'family.revision_created',
      subject: familySubject(id),
      details: { revision: number, from: current.number, fields: changed, variants: count },
    });
  });
  return view(ctx, id, person);
}

/**
 * Starts computing the current revision in the background (a draft only).
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 */
export async function startCompute(ctx: FamilyContext, person: Person, id: string): Promise<ComputeStatus> {
  const { current } = await loadFamily(ctx.db, id);
  if (current.state !== 'draft') {
    throw invalidState(`cannot compute a family that is ${current.state.replace('_', ' ')}; only a draft is computed`);
  }
  await familyJobs(ctx).enqueue(current.id);
  await recordAudit(ctx.db, {
    actorId: person.id,
    action: 'family.compute_started',
    subject: familySubject(id),
    details: { revision: current.number },
  });
  const { current: queued } = await loadFamily(ctx.db, id);
  return toComputeStatus(queued);
}

/**
 * Cancels the computation of the current revision (nothing happens when none runs).
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 */
export async function cancelCompute(ctx: FamilyContext, person: Person, id: string): Promise<ComputeStatus> {
  const { current } = await loadFamily(ctx.db, id);
  if (await familyJobs(ctx).cancel(current.id)) {
    await recordAudit(ctx.db, {
      actorId: person.id,
      action: 'family.compute_cancelled',
      subject: familySubject(id),
      details: { revision: current.number },
    });
  }
  const { current: after } = await loadFamily(ctx.db, id);
  return toComputeStatus(after);
}

/**
 * Stores written acknowledgements of bird-fit warnings for the current (draft) revision, one per code.
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 * @param body - code and text per warning
 */
export async function acknowledgeWarnings(
  ctx: FamilyContext,
  person: Person,
  id: string,
  body: AcknowledgementsCreate,
): Promise<Family> {
  await ctx.db.transaction(async (tx) => {
    const { current } = await loadFamily(tx, id);
    if (current.state !== 'draft') {
      throw invalidState(`cannot acknowledge warnings of a family that is ${current.state.replace('_', ' ')}`);
    }
    for (const ack of body.acknowledgements) {
      await tx
        .insert(familyAcknowledgements)
        .values({ revisionId: current.id, code: ack.code, text: ack.text, personId: person.id })
        .onConflictDoUpdate({
          target: [familyAcknowledgements.revisionId, familyAcknowledgements.code],
          set: { text: ack.text, personId: person.id, at: new Date() },
        });
    }
    await tx
      .update(familyRevisions)
      .set({ lock: sql`${familyRevisions.lock} + 1`, updatedAt: new Date() })
      .where(eq(familyRevisions.id, current.id));
    await recordAudit(tx, {
      actorId: person.id,
      action: 'family.acknowledged',
      subject: familySubject(id),
      details: { revision: current.number, acknowledgements: body.acknowledgements },
    });
  });
  return view(ctx, id, person);
}

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
  kickMail(ctx);
  return view(ctx, id, person);
}

const VERDICT_ORDER = { fail: 0, warn: 1, pass: 2 } as const;

/**
 * The variants of a revision, filtered, sorted and paged.
 * @param ctx - app context
 * @param id - family id
 * @param query - revision, filters, sort and page
 */
export async function listVariants(
  ctx: FamilyContext,
  id: string,
  query: VariantListQuery,
): Promise<VariantListResponse> {
  const { family } = await loadFamily(ctx.db, id);
  const number = query.revision ?? family.currentRevision;
  const [revision] = await ctx.db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, number)));
  if (!revision) throw notFound(`revision: family has no revision ${number}`);
  const rows = await ctx.db
    .select()
    .from(familyVariants)
    .where(eq(familyVariants.revisionId, revision.id))
    .orderBy(asc(familyVariants.index));
  const q = query.q?.toLowerCase();
  const filtered = rows
    .map(toVariant)
    .filter((v) => (!query.verdict || v.verdict === query.verdict) && (!q || v.sku.toLowerCase().includes(q)));
  const key = (v: (typeof filtered)[number]): number | string => {
    switch (query.sort) {
      case 'sku':
        return v.sku;
      case 'verdict':
        return v.verdict ? VERDICT_ORDER[v.verdict] : 3;
      case 'costCents':
        return v.cost?.costCents ?? Infinity;
      case 'supportVolumeMm3':
        return v.report?.supportVolumeMm3 ?? Infinity;
      case 'printTimeMin':
        return v.report?.printTimeMin ?? Infinity;
      default:
        return v.index;
    }
  };
  const sign = query.dir === 'desc' ? -1 : 1;
  filtered.sort((a, b) => {
    const ka = key(a);
    const kb = key(b);
    const order = ka < kb ? -1 : ka > kb ? 1 : a.index - b.index;
    return sign * order;
  });
  const start = (query.page - 1) * query.pageSize;
  return {
    variants: filtered.slice(start, start + query.pageSize),
    total: filtered.length,
    page: query.page,
    pageSize: query.pageSize,
    revision: number,
  };
}

/**
 * The parameter and axis changes between two revisions of a family.
 * @param ctx - app context
 * @param id - family id
 * @param from - older revision number
 * @param to - newer revision number
 */
export async function diffRevisions(ctx: FamilyContext, id: string, from: number, to: number): Promise<RevisionDiff> {
  await loadFamily(ctx.db, id);
  const rows = await ctx.db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), inArray(familyRevisions.number, [from, to])));
  const a = rows.find((row) => row.number === from);
  const b = rows.find((row) => row.number === to);
  if (!a) throw notFound(`from: family has no revision ${from}`);
  if (!b) throw notFound(`to: family has no revision ${to}`);
  // Compare complete parameters: a key one revision leaves at the template default and the other sets to that same
  // default is not a change.
  const complete = (revision: FamilyRevisionRow) => {
    const template = findTemplate(revision.templateId);
    if (!template) return revision;
    try {
      return { ...revision, baseParams: parseParams(template, revision.baseParams) };
    } catch {
      return revision;
    }
  };
  return revisionDiff(complete(a), complete(b));
}

/**
 * The audit log of a family, newest first.
 * @param ctx - app context
 * @param id - family id
 */
export async function familyAudit(ctx: FamilyContext, id: string): Promise<AuditListResponse> {
  await loadFamily(ctx.db, id);
  const rows = await ctx.db
    .select()
    .from(auditEvents)
    .where(eq(auditEvents.subject, familySubject(id)))
    .orderBy(desc(auditEvents.id));
  const names = await actorsById(
    ctx.db,
    rows.map((row) => row.actorId),
  );
  return {
    events: rows.map((row) => ({
      id: row.id,
      action: row.action,
      actor: row.actorId ? (names.get(row.actorId) ?? { id: row.actorId, name: 'someone' }) : null,
      at: row.at.toISOString(),
      details: row.details,
    })),
  };
}
