import { and, asc, eq, ne } from 'drizzle-orm';
import type { VariantVerdict } from '../../shared/schemas/variant';
import type { CostRates, PrintSettings } from '../../shared/schemas/production';
import type { Db } from '../db/client';
import { familyRevisions, familyVariants, families } from '../db/schema';
import { loadMaterials, loadPrinters } from '../services/familyProduction';
import { evaluateVariant } from './evaluateVariant';
import { loadPrintSettings } from './loadPrintSettings';
import { addTargetDrivers } from './targetDrivers';
import type { VariantGeometry } from './variantGeometry';

/** What a computed variant row is updated with. */
export type VariantUpdate = Partial<typeof familyVariants.$inferInsert> & { verdict: VariantVerdict };

/** What evaluating a variant of a revision needs besides its geometry. */
export interface RevisionInputs {
  revision: typeof familyRevisions.$inferSelect;
  printer: NonNullable<ReturnType<Awaited<ReturnType<typeof loadPrinters>>['get']>>;
  materials: Awaited<ReturnType<typeof loadMaterials>>;
  /** The studio's print settings with the family's perimeters and infill laid over them. */
  settings: PrintSettings;
  /** The studio's cost rates and finishes. */
  rates: CostRates;
}

/**
 * Loads a revision with its printer profile, the materials list, and the print settings (with the family's recipe)
 * and cost rates its variants are priced with.
 * @param db - database
 * @param revisionId - the revision
 * @returns null when the revision is gone
 * @throws when the revision's printer is not in the printer profiles
 */
export async function loadRevisionInputs(db: Db, revisionId: string): Promise<RevisionInputs | null> {
  const [revision] = await db.select().from(familyRevisions).where(eq(familyRevisions.id, revisionId));
  if (!revision) return null;
  const printer = (await loadPrinters(db)).get(revision.printerId);
  if (!printer) throw new Error(`printer ${revision.printerId} is not in the printer profiles`);
  const { settings, rates } = await loadPrintSettings(db, revision.printRecipe);
  return { revision, printer, materials: await loadMaterials(db), settings, rates };
}

/**
 * The stored result of a variant whose geometry was built: fit, cost, bird fit, outdoor heat, production targets
 * and verdict.
 * @param inputs - the revision, its printer, the materials, settings and rates
 * @param variant - the variant row
 * @param geometry - its built and analysed geometry
 * @throws when the variant's material is not in the materials list
 */
export function evaluatedUpdate(
  inputs: RevisionInputs,
  variant: typeof familyVariants.$inferSelect,
  geometry: VariantGeometry,
): VariantUpdate {
  const material = inputs.materials.get(variant.attributes.material);
  if (!material) throw new Error(`material ${variant.attributes.material} is not in the materials list`);
  const evaluation = evaluateVariant(geometry, {
    printer: inputs.printer,
    material,
    supportBudgetMm3: inputs.revision.supportBudgetMm3,
    region: inputs.revision.region,
    colourId: variant.attributes.colour,
    settings: inputs.settings,
    rates: inputs.rates,
    finishId: variant.attributes.finish,
    targets: inputs.revision.targets,
  });
  return { status: 'done', sha256: geometry.sha256, params: geometry.params, ...evaluation, error: null };
}

/**
 * The stored result of a variant the template could not build.
 * @param err - what went wrong
 */
export function failedUpdate(err: unknown): VariantUpdate {
  return {
    status: 'failed',
    verdict: 'fail',
    reasons: ['the template could not build it'],
    error: err instanceof Error ? err.message : String(err),
  };
}

/** How {@link computeRevision} builds geometry and reports progress. */
export interface ComputeRevisionOptions {
  /** Builds and analyses one parameter set (the worker thread in the app; inline in the seed). */
  geometry(templateId: string, params: Record<string, unknown>): Promise<VariantGeometry>;
  /** Checked between variants; true stops without finishing. */
  isCancelled(): boolean;
  /** Called after each variant is stored. */
  onVariant?(doneCount: number, total: number, variant: { sku: string; verdict: VariantVerdict }): void;
}

/**
 * Computes the pending variants of a revision: each distinct parameter set is built once (colours, finishes and
 * materials do not change the mesh), every variant is evaluated and stored with the revision's done count.
 * Marks the revision running, and done at the end unless cancelled.
 * @param db - database
 * @param revisionId - the revision
 * @param options - geometry builder, cancellation and progress
 * @returns false when cancelled before the end
 */
export async function computeRevision(db: Db, revisionId: string, options: ComputeRevisionOptions): Promise<boolean> {
  const inputs = await loadRevisionInputs(db, revisionId);
  if (!inputs) return false;
  const { revision } = inputs;
  const variants = await db
    .select()
    .from(familyVariants)
    .where(and(eq(familyVariants.revisionId, revisionId), eq(familyVariants.status, 'pending')))
    .orderBy(asc(familyVariants.index));
  let done = revision.computeDone;
  const total = done + variants.length;
  // A cancel that lands while the inputs load has already stored `cancelled`: it must not be overwritten.
  if (options.isCancelled()) return false;
  await db
    .update(familyRevisions)
    .set({ computeState: 'running', computeTotal: total, computeStartedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(familyRevisions.id, revisionId), ne(familyRevisions.computeState, 'cancelled')));

  const geometries = new Map<string, Promise<VariantGeometry>>();
  for (const variant of variants) {
    if (options.isCancelled()) return false;
    const paramsKey = JSON.stringify(variant.params);
    let pending = geometries.get(paramsKey);
    if (!pending) {
      pending = options.geometry(revision.templateId, variant.params);
      pending.catch(() => {});
      geometries.set(paramsKey, pending);
    }
    let update: VariantUpdate;
    try {
      update = evaluatedUpdate(inputs, variant, await pending);
    } catch (err) {
      if (options.isCancelled()) return false;
      update = failedUpdate(err);
    }
    if (options.isCancelled()) return false;
    done += 1;
    await db.transaction(async (tx) => {
      await tx
        .update(familyVariants)
        .set({ ...update, updatedAt: new Date() })
        .where(eq(familyVariants.id, variant.id));
      await tx
        .update(familyRevisions)
        .set({ computeDone: done, updatedAt: new Date() })
        .where(eq(familyRevisions.id, revisionId));
    });
    options.onVariant?.(done, total, { sku: variant.sku, verdict: update.verdict });
  }
  if (options.isCancelled()) return false;
  await addRevisionTargetDrivers(db, inputs, (params) => {
    const key = JSON.stringify(params);
    let pending = geometries.get(key);
    if (!pending) {
      pending = options.geometry(revision.templateId, params);
      pending.catch(() => {});
      geometries.set(key, pending);
    }
    return pending;
  });
  const now = new Date();
  await db
    .update(familyRevisions)
    .set({ computeState: 'done', computeError: null, computeFinishedAt: now, updatedAt: now })
    .where(eq(familyRevisions.id, revisionId));
  await db.update(families).set({ updatedAt: now }).where(eq(families.id, revision.familyId));
  return true;
}

/**
 * After the last variant: for each production target some variant misses, the parameter that moves it most on the
 * worst variant (server/jobs/targetDrivers.ts), added to that variant's checks and reasons.
 * @param db - database
 * @param inputs - the revision, printer, materials, settings and rates
 * @param geometry - builds one parameter set of the revision's template (cached by the caller)
 */
export async function addRevisionTargetDrivers(
  db: Db,
  inputs: RevisionInputs,
  geometry: (params: Record<string, unknown>) => Promise<VariantGeometry>,
): Promise<void> {
  const { revision, printer, materials, settings, rates } = inputs;
  await addTargetDrivers(db, revision.id, revision.templateId, geometry, materials, {
    printer,
    supportBudgetMm3: revision.supportBudgetMm3,
    region: revision.region,
    settings,
    rates,
    targets: revision.targets,
  });
}
