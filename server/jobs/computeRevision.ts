import { and, asc, eq } from 'drizzle-orm';
import type { VariantVerdict } from '../../shared/schemas/variant';
import type { Db } from '../db/client';
import { familyRevisions, familyVariants, families } from '../db/schema';
import { loadMaterials, loadPrinters } from '../services/familyProduction';
import { evaluateVariant } from './evaluateVariant';
import type { VariantGeometry } from './variantGeometry';

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
  const [revision] = await db.select().from(familyRevisions).where(eq(familyRevisions.id, revisionId));
  if (!revision) return false;
  const variants = await db
    .select()
    .from(familyVariants)
    .where(and(eq(familyVariants.revisionId, revisionId), eq(familyVariants.status, 'pending')))
    .orderBy(asc(familyVariants.index));
  const printers = await loadPrinters(db);
  const materials = await loadMaterials(db);
  const printer = printers.get(revision.printerId);
  if (!printer) throw new Error(`printer ${revision.printerId} is not in the printer profiles`);
  let done = revision.computeDone;
  const total = done + variants.length;
  await db
    .update(familyRevisions)
    .set({ computeState: 'running', computeTotal: total, computeStartedAt: new Date(), updatedAt: new Date() })
    .where(eq(familyRevisions.id, revisionId));

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
    let update: Partial<typeof familyVariants.$inferInsert> & { verdict: VariantVerdict };
    try {
      const geometry = await pending;
      const material = materials.get(variant.attributes.material);
      if (!material) throw new Error(`material ${variant.attributes.material} is not in the materials list`);
      const evaluation = evaluateVariant(geometry, {
        printer,
        material,
        supportBudgetMm3: revision.supportBudgetMm3,
        region: revision.region,
        colourId: variant.attributes.colour,
      });
      update = { status: 'done', sha256: geometry.sha256, params: geometry.params, ...evaluation, error: null };
    } catch (err) {
      if (options.isCancelled()) return false;
      update = {
        status: 'failed',
        verdict: 'fail',
        reasons: ['the template could not build it'],
        error: (err as Error).message,
      };
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
  const now = new Date();
  await db
    .update(familyRevisions)
    .set({ computeState: 'done', computeError: null, computeFinishedAt: now, updatedAt: now })
    .where(eq(familyRevisions.id, revisionId));
  await db.update(families).set({ updatedAt: now }).where(eq(families.id, revision.familyId));
  return true;
}
