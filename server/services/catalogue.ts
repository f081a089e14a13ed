/**
 * The published catalogue: every variant of every family's published revision, with what a spec sheet, a price list
 * or a quote needs. `listCatalogueVariants` and `getVariantBySku` are the entry points other features use.
 */
import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm';
import type { Acknowledgement } from '../../shared/schemas/gate';
import type { Photo } from '../../shared/schemas/photo';
import type { CatalogueQuery, CatalogueVariant } from '../../shared/schemas/catalogue';
import type { AppContext } from '../context';
import type { Db } from '../db/client';
import {
  familyAcknowledgements,
  familyPhotos,
  familyRevisions,
  familyVariants,
  families,
  type FamilyVariantRow,
} from '../db/schema';
import { cachedCatalogueValue } from './catalogueCache';
import { actorsById, toPhoto } from './familyView';

/** Filter of {@link listCatalogueVariants} (all optional). */
export type CatalogueFilter = Partial<CatalogueQuery> & {
  /** Only these SKUs. */
  skus?: string[];
};

/**
 * Published variants, ordered by family name and matrix position. Only computed variants of a published revision
 * are listed; a family's newer draft revision never shows here until it is published. The full list is built once
 * and kept until the catalogue changes (see ./catalogueCache); the filters are applied to it. The variants are shared
 * by every caller: treat them as read-only.
 * @param ctx - app context
 * @param filter - search text (SKU or family name), family, colour, material, SKUs
 */
export async function listCatalogueVariants(
  ctx: AppContext,
  filter: CatalogueFilter = {},
): Promise<CatalogueVariant[]> {
  const all = await cachedCatalogueValue(ctx, 'published-variants', () => loadPublishedVariants(ctx.db));
  const q = filter.q?.toLowerCase();
  const skus = filter.skus ? new Set(filter.skus) : undefined;
  return all.filter(
    (item) =>
      (!filter.familyId || item.family.id === filter.familyId) &&
      (!skus || skus.has(item.sku)) &&
      (!q || item.sku.toLowerCase().includes(q) || item.family.name.toLowerCase().includes(q)) &&
      (!filter.colour || item.attributes.colour === filter.colour) &&
      (!filter.material || item.attributes.material === filter.material),
  );
}

/** Every published variant, read with one query per table (families with revisions, variants, photos, acknowledgements). */
async function loadPublishedVariants(db: Db): Promise<CatalogueVariant[]> {
  const published = await db
    .select({ family: families, revision: familyRevisions })
    .from(families)
    .innerJoin(
      familyRevisions,
      and(eq(familyRevisions.familyId, families.id), eq(familyRevisions.number, families.publishedRevision)),
    )
    .where(and(isNotNull(families.publishedRevision), eq(familyRevisions.state, 'published')));
  if (published.length === 0) return [];
  const revisionIds = published.map((row) => row.revision.id);
  const variants = await db
    .select()
    .from(familyVariants)
    .where(and(inArray(familyVariants.revisionId, revisionIds), eq(familyVariants.status, 'done')))
    .orderBy(asc(familyVariants.index));
  const photoRows = await db
    .select()
    .from(familyPhotos)
    .where(
      inArray(
        familyPhotos.familyId,
        published.map((row) => row.family.id),
      ),
    )
    .orderBy(asc(familyPhotos.createdAt));
  const ackRows = await db
    .select()
    .from(familyAcknowledgements)
    .where(inArray(familyAcknowledgements.revisionId, revisionIds))
    .orderBy(asc(familyAcknowledgements.id));
  const names = await actorsById(db, [
    ...photoRows.map((row) => row.uploadedBy),
    ...ackRows.map((row) => row.personId),
  ]);
  const actor = (id: string) => names.get(id) ?? { id, name: 'someone' };
  const photosByFamily = new Map<string, Photo[]>();
  for (const row of photoRows) {
    const list = photosByFamily.get(row.familyId) ?? [];
    list.push(toPhoto(row, actor(row.uploadedBy)));
    photosByFamily.set(row.familyId, list);
  }
  const acksByRevision = new Map<string, Acknowledgement[]>();
  for (const row of ackRows) {
    const list = acksByRevision.get(row.revisionId) ?? [];
    list.push({ code: row.code, text: row.text, by: actor(row.personId), at: row.at.toISOString() });
    acksByRevision.set(row.revisionId, list);
  }
  const variantsByRevision = new Map<string, FamilyVariantRow[]>();
  for (const variant of variants) {
    const list = variantsByRevision.get(variant.revisionId) ?? [];
    list.push(variant);
    variantsByRevision.set(variant.revisionId, list);
  }

  const result: CatalogueVariant[] = [];
  for (const { family, revision } of published.sort((a, b) => a.revision.name.localeCompare(b.revision.name))) {
    for (const variant of variantsByRevision.get(revision.id) ?? []) {
      const item = toCatalogueVariant(
        variant,
        family,
        revision,
        photosByFamily.get(family.id) ?? [],
        acksByRevision.get(revision.id) ?? [],
      );
      if (item) result.push(item);
    }
  }
  return result;
}

/**
 * One published variant by SKU, or undefined when no published revision has it.
 * @param ctx - app context
 * @param sku - the SKU, e.g. `FH-HGB-28-SHIN-SAND`
 */
export async function getVariantBySku(ctx: AppContext, sku: string): Promise<CatalogueVariant | undefined> {
  const [variant] = await listCatalogueVariants(ctx, { skus: [sku] });
  return variant;
}

function toCatalogueVariant(
  variant: FamilyVariantRow,
  family: typeof families.$inferSelect,
  revision: typeof familyRevisions.$inferSelect,
  photos: Photo[],
  acknowledgements: Acknowledgement[],
): CatalogueVariant | undefined {
  if (!variant.report || !variant.cost) return undefined;
  return {
    sku: variant.sku,
    variantKey: variant.variantKey,
    axisValues: variant.axisValues,
    params: variant.params,
    attributes: variant.attributes,
    sha256: variant.sha256,
    verdict: variant.verdict,
    birdFitWarnings: variant.birdFitWarnings,
    family: { id: family.id, code: family.code, name: revision.name, description: revision.description },
    revision: revision.number,
    templateId: revision.templateId,
    templateVersion: revision.templateVersion,
    report: variant.report,
    cost: variant.cost,
    priceCents: variant.cost.suggestedPriceCents,
    currency: variant.cost.currency,
    acknowledgements,
    photos,
    publishedAt: (revision.publishedAt ?? revision.updatedAt).toISOString(),
  };
}
