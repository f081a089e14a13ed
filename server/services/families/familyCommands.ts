/** Commands on families: create a family, edit it (in place or as a new revision) and acknowledge warnings. */
import { and, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import { buildVariantMatrix } from '../../../shared/families/variantMatrix';
import type { Person } from '../../../shared/schemas/auth';
import type { FamilyCreateSchema, FamilyUpdate } from '../../../shared/schemas/familySpec';
import type { AcknowledgementsCreate } from '../../../shared/schemas/gate';
import type { Family } from '../../../shared/schemas/family';
import { findTemplate, parseParams } from '../../../templates/index';
import type { Queryable } from '../../db/client';
import { familyAcknowledgements, familyRevisions, familyVariants, families } from '../../db/schema';
import { HttpError } from '../../http/HttpError';
import { familyJobs } from '../../jobs/FamilyJobRunner';
import { recordAudit } from '../audit';
import { lockProfilesNamed } from '../catalogueReferences';
import { loadMaterials, loadPrinters } from '../familyProduction';
import { checkFamilySpec, type SpecToCheck } from '../familySpecCheck';
import { familySubject, invalidState, loadFamily, stateChanged, viewFamily, type FamilyContext } from './loadFamily';

/** Body of create after parsing (defaults applied). */
export type FamilyCreateParsed = z.output<typeof FamilyCreateSchema>;

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
 * Checks a spec inside the save's transaction, against the printers and materials as they are once the ones it
 * names are locked: a profile removed meanwhile is refused in words, and none can be removed until the save commits.
 * @param tx - the save's transaction
 * @param spec - the family content
 */
async function checkNamedProfiles(tx: Queryable, spec: SpecToCheck): Promise<{ templateVersion: number }> {
  const materialAxis = spec.axes.find((axis) => axis.kind === 'attribute' && axis.key === 'material');
  await lockProfilesNamed(tx, spec.printerId, [spec.materialId, ...(materialAxis?.values.map(String) ?? [])]);
  return checkFamilySpec(spec, await loadPrinters(tx), await loadMaterials(tx));
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
  const id = await ctx.db.transaction(async (tx) => {
    const { templateVersion } = await checkNamedProfiles(tx, spec);
    const [taken] = await tx.select({ id: families.id }).from(families).where(eq(families.code, body.code));
    if (taken) {
      // Answered at the field: the client shows `details` beside the SKU code input.
      const message = `Another family already uses the code ${body.code}: choose another.`;
      throw new HttpError(409, 'code_taken', message, [{ in: 'body', path: 'code', message }]);
    }
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
        targets: spec.targets,
        printRecipe: spec.printRecipe,
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
  return viewFamily(ctx, id, person);
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
      targets: patch.targets ?? current.targets,
      printRecipe: patch.printRecipe ?? current.printRecipe,
    };
    const checked = await checkNamedProfiles(tx, spec);
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
  return viewFamily(ctx, id, person);
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
  return viewFamily(ctx, id, person);
}
