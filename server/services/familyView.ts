/** Reads families from the database into the API shapes of shared/schemas/family.ts. */
import { PrintRecipeSchema } from '../../shared/schemas/wallRecipe';
import { asc, desc, eq, inArray } from 'drizzle-orm';
import { allowedActions } from '../../shared/families/familyWorkflow';
import { evaluateFamilyGate } from '../../shared/families/familyGate';
import { reasonsAfterAcknowledgements } from '../../shared/families/variantVerdict';
import type { Person } from '../../shared/schemas/auth';
import type { FamilyAction } from '../../shared/schemas/familySpec';
import type { ComputeStatus, Variant } from '../../shared/schemas/variant';
import type { Actor } from '../../shared/schemas/review';
import type { Acknowledgement, FamilyGate } from '../../shared/schemas/gate';
import type { Photo } from '../../shared/schemas/photo';
import type { Family, FamilySummary } from '../../shared/schemas/family';
import { findTemplate } from '../../templates/index';
import type { Queryable } from '../db/client';
import {
  familyAcknowledgements,
  familyPhotos,
  familyRevisions,
  familyVariants,
  families,
  people,
  type FamilyPhotoRow,
  type FamilyRevisionRow,
  type FamilyRow,
  type FamilyVariantRow,
} from '../db/schema';

/**
 * Names of people by id (unknown ids map to "someone").
 * @param db - database
 * @param ids - person ids
 */
export async function actorsById(db: Queryable, ids: Iterable<string | null>): Promise<Map<string, Actor>> {
  const wanted = [...new Set([...ids].filter((id): id is string => Boolean(id)))];
  if (wanted.length === 0) return new Map();
  const rows = await db.select({ id: people.id, name: people.name }).from(people).where(inArray(people.id, wanted));
  return new Map(rows.map((row) => [row.id, row]));
}

function actor(map: Map<string, Actor>, id: string | null): Actor {
  return (id && map.get(id)) || { id: id ?? '', name: 'someone' };
}

/** The API shape of a variant row. @param row - the stored variant */
export function toVariant(row: FamilyVariantRow): Variant {
  return {
    id: row.id,
    index: row.index,
    sku: row.sku,
    variantKey: row.variantKey,
    axisValues: row.axisValues,
    params: row.params,
    attributes: row.attributes,
    status: row.status,
    sha256: row.sha256,
    report: row.report,
    cost: row.cost,
    verdict: row.verdict,
    reasons: row.reasons,
    birdFitWarnings: row.birdFitWarnings,
    error: row.error,
  };
}

/**
 * The API shape of a variant row as people read it now: its reasons say which warnings have been acknowledged for
 * its revision (the stored verdict was computed before them).
 * @param row - the stored variant
 * @param acknowledged - warning codes acknowledged for its revision
 */
export function toVariantAcknowledged(row: FamilyVariantRow, acknowledged: ReadonlySet<string>): Variant {
  const variant = toVariant(row);
  return { ...variant, reasons: reasonsAfterAcknowledgements(variant, acknowledged) };
}

/** The API shape of a photo row. @param row - stored photo @param uploader - who uploaded it */
export function toPhoto(row: FamilyPhotoRow, uploader: Actor): Photo {
  return {
    id: row.id,
    familyId: row.familyId,
    caption: row.caption,
    widthPx: row.widthPx,
    heightPx: row.heightPx,
    originalType: row.originalType,
    uploadedBy: uploader,
    createdAt: row.createdAt.toISOString(),
    url: `/api/photos/${row.id}`,
    thumbUrl: `/api/photos/${row.id}/thumb`,
  };
}

/** The compute status of a revision row. @param row - the revision */
export function toComputeStatus(row: FamilyRevisionRow): ComputeStatus {
  return {
    state: row.computeState,
    doneCount: row.computeDone,
    total: row.computeTotal,
    startedAt: row.computeStartedAt?.toISOString() ?? null,
    finishedAt: row.computeFinishedAt?.toISOString() ?? null,
    error: row.computeError,
  };
}

/**
 * The acknowledgements of a revision with who wrote them.
 * @param db - database
 * @param revisionId - the revision
 */
export async function acknowledgementsOf(db: Queryable, revisionId: string): Promise<Acknowledgement[]> {
  const rows = await db
    .select()
    .from(familyAcknowledgements)
    .where(eq(familyAcknowledgements.revisionId, revisionId))
    .orderBy(asc(familyAcknowledgements.id));
  const names = await actorsById(
    db,
    rows.map((row) => row.personId),
  );
  return rows.map((row) => toAcknowledgement(row, names));
}

/** The API shape of an acknowledgement row. @param row - the stored row @param names - people by id */
function toAcknowledgement(
  row: typeof familyAcknowledgements.$inferSelect,
  names: Map<string, Actor>,
): Acknowledgement {
  return { code: row.code, text: row.text, by: actor(names, row.personId), at: row.at.toISOString() };
}

/**
 * The gate of a revision.
 * @param db - database
 * @param revision - the revision row
 */
export async function gateOf(db: Queryable, revision: FamilyRevisionRow): Promise<FamilyGate> {
  const variants = await db.select().from(familyVariants).where(eq(familyVariants.revisionId, revision.id));
  return evaluateGateOf(revision, variants, await acknowledgementsOf(db, revision.id));
}

/** The gate of a revision from its variant rows and acknowledgements, already read. */
function evaluateGateOf(
  revision: FamilyRevisionRow,
  variants: FamilyVariantRow[],
  acknowledgements: Acknowledgement[],
): FamilyGate {
  return evaluateFamilyGate({
    computeState: revision.computeState,
    supportBudgetMm3: revision.supportBudgetMm3,
    templateVersion: revision.templateVersion,
    currentTemplateVersion: findTemplate(revision.templateId)?.version ?? revision.templateVersion,
    variants: variants.map(toVariant),
    acknowledgements,
  });
}

/**
 * The workflow actions a person may take on a family now.
 * @param person - the signed-in person
 * @param current - the current revision
 * @param family - the family (retire acts on its published revision)
 */
export function actionsFor(person: Person, current: FamilyRevisionRow, family: FamilyRow): FamilyAction[] {
  const actions: FamilyAction[] = allowedActions(current.state, person.roles).filter((action) => action !== 'retire');
  if (family.publishedRevision !== null && person.roles.includes('catalogue_manager')) actions.push('retire');
  return actions;
}

/**
 * One family as the API shows it, or undefined.
 * @param db - database
 * @param id - family id
 * @param person - the signed-in person (for allowedActions)
 */
export async function familyView(db: Queryable, id: string, person: Person): Promise<Family | undefined> {
  const [family] = await db.select().from(families).where(eq(families.id, id));
  if (!family) return undefined;
  const revisions = await db
    .select()
    .from(familyRevisions)
    .where(eq(familyRevisions.familyId, id))
    .orderBy(asc(familyRevisions.number));
  const current = revisions.find((revision) => revision.number === family.currentRevision);
  if (!current) throw new Error(`Family ${id} has no revision ${family.currentRevision}`);
  const photos = await db
    .select()
    .from(familyPhotos)
    .where(eq(familyPhotos.familyId, id))
    .orderBy(desc(familyPhotos.createdAt));
  const names = await actorsById(db, [family.ownerId, ...photos.map((photo) => photo.uploadedBy)]);
  const gate = await gateOf(db, current);
  return {
    id: family.id,
    code: family.code,
    name: current.name,
    description: current.description,
    templateId: current.templateId,
    templateVersion: current.templateVersion,
    baseParams: current.baseParams,
    axes: current.axes,
    supportBudgetMm3: current.supportBudgetMm3,
    printerId: current.printerId,
    materialId: current.materialId,
    region: current.region,
    targets: current.targets,
    printRecipe: PrintRecipeSchema.parse(current.printRecipe),
    owner: actor(names, family.ownerId),
    state: current.state,
    revision: current.number,
    publishedRevision: family.publishedRevision,
    lock: current.lock,
    variantCount: current.computeTotal || (await countVariants(db, current.id)),
    compute: toComputeStatus(current),
    gate,
    acknowledgements: await acknowledgementsOf(db, current.id),
    comments: current.comments,
    revisions: revisions.map((revision) => ({
      number: revision.number,
      state: revision.state,
      createdAt: revision.createdAt.toISOString(),
      publishedAt: revision.publishedAt?.toISOString() ?? null,
    })),
    photos: photos.map((photo) => toPhoto(photo, actor(names, photo.uploadedBy))),
    allowedActions: actionsFor(person, current, family),
    createdAt: family.createdAt.toISOString(),
    updatedAt: (current.updatedAt > family.updatedAt ? current.updatedAt : family.updatedAt).toISOString(),
  };
}

async function countVariants(db: Queryable, revisionId: string): Promise<number> {
  const rows = await db
    .select({ id: familyVariants.id })
    .from(familyVariants)
    .where(eq(familyVariants.revisionId, revisionId));
  return rows.length;
}

/** Groups rows by a key. */
function groupBy<T>(rows: T[], key: (row: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const group = groups.get(key(row));
    if (group) group.push(row);
    else groups.set(key(row), [row]);
  }
  return groups;
}

/**
 * Every family as a list row, most recently changed first. The gates of all current revisions are evaluated from
 * one read of their variants and one of their acknowledgements (not a query or three per family).
 * @param db - database
 */
export async function familySummaries(db: Queryable): Promise<FamilySummary[]> {
  const rows = await db.select().from(families);
  const revisions = await db.select().from(familyRevisions);
  const currents = new Map<string, FamilyRevisionRow>();
  for (const family of rows) {
    const current = revisions.find((r) => r.familyId === family.id && r.number === family.currentRevision);
    if (current) currents.set(family.id, current);
  }
  const currentIds = [...currents.values()].map((revision) => revision.id);
  const variantRows = currentIds.length
    ? await db.select().from(familyVariants).where(inArray(familyVariants.revisionId, currentIds))
    : [];
  const ackRows = currentIds.length
    ? await db
        .select()
        .from(familyAcknowledgements)
        .where(inArray(familyAcknowledgements.revisionId, currentIds))
        .orderBy(asc(familyAcknowledgements.id))
    : [];
  const names = await actorsById(db, [...rows.map((row) => row.ownerId), ...ackRows.map((row) => row.personId)]);
  const variantsOf = groupBy(variantRows, (row) => row.revisionId);
  const acksOf = groupBy(ackRows, (row) => row.revisionId);
  const summaries: FamilySummary[] = [];
  for (const family of rows) {
    const current = currents.get(family.id);
    if (!current) continue;
    const variants = variantsOf.get(current.id) ?? [];
    const gate = evaluateGateOf(
      current,
      variants,
      (acksOf.get(current.id) ?? []).map((row) => toAcknowledgement(row, names)),
    );
    const updated = current.updatedAt > family.updatedAt ? current.updatedAt : family.updatedAt;
    summaries.push({
      id: family.id,
      code: family.code,
      name: current.name,
      templateId: current.templateId,
      templateVersion: current.templateVersion,
      owner: actor(names, family.ownerId),
      state: current.state,
      revision: current.number,
      publishedRevision: family.publishedRevision,
      variantCount: current.computeTotal || variants.length,
      updatedAt: updated.toISOString(),
      computeState: current.computeState,
      gateOk: gate.ok,
    });
  }
  return summaries.sort((a, b) => b.updatedAt.localeCompare(a.updatedAt));
}
