/**
 * Print files of published variants: the mesh is rebuilt from the variant's template and parameters and must give
 * the same mesh hash the variant was published (and sold) with; the binary STL goes to the farm once per hash, and
 * the part sizes are kept for the run planner.
 */
import { and, eq } from 'drizzle-orm';
import { partSizesMm } from '../../shared/analysis/fitParts';
import { writeStl } from '../../shared/mesh/writeStl';
import { generate } from '../../templates/generate';
import type { Db } from '../db/client';
import { familyRevisions, familyVariants, farmPrintFiles } from '../db/schema';
import type { FarmClient } from './FarmClient';

/** A variant's mesh no longer builds to the hash it was sold with: a person must look (never retried). */
export class PinnedMeshError extends Error {
  /** @param message - for people */
  constructor(message: string) {
    super(message);
    this.name = 'PinnedMeshError';
  }
}

/** What one build of a variant gives. */
interface BuiltFile {
  stl: Uint8Array<ArrayBuffer>;
  partSizesMm: Array<[number, number, number]>;
}

/**
 * Builds the mesh of a variant with this hash and checks the hash.
 * @param db - database
 * @param meshSha256 - the pinned hash
 * @param sku - the variant's SKU (narrows the search)
 * @throws PinnedMeshError when no variant has this hash or the rebuilt mesh differs
 */
async function buildPinned(db: Db, meshSha256: string, sku?: string): Promise<BuiltFile> {
  const [variant] = await db
    .select({ params: familyVariants.params, templateId: familyRevisions.templateId, sku: familyVariants.sku })
    .from(familyVariants)
    .innerJoin(familyRevisions, eq(familyRevisions.id, familyVariants.revisionId))
    .where(and(eq(familyVariants.sha256, meshSha256), sku ? eq(familyVariants.sku, sku) : undefined))
    .limit(1);
  if (!variant) throw new PinnedMeshError(`no variant has the mesh ${meshSha256.slice(0, 12)}… that was sold`);
  const built = await generate(variant.templateId, variant.params);
  if (built.sha256 !== meshSha256)
    throw new PinnedMeshError(
      `${variant.sku} now builds a different mesh (${built.sha256.slice(0, 12)}…) than the one sold ` +
        `(${meshSha256.slice(0, 12)}…): the template changed; publish a new revision or refund`,
    );
  return { stl: writeStl(built.mesh), partSizesMm: partSizesMm(built.mesh, built.partTriangles) };
}

/**
 * Part sizes of a variant's mesh, measured once and kept (building takes a second or two).
 * @param db - database
 * @param meshSha256 - the variant's mesh hash
 * @param sku - its SKU
 */
export async function partSizesOf(db: Db, meshSha256: string, sku?: string): Promise<Array<[number, number, number]>> {
  const [known] = await db.select().from(farmPrintFiles).where(eq(farmPrintFiles.meshSha256, meshSha256));
  if (known) return known.partSizesMm;
  const built = await buildPinned(db, meshSha256, sku);
  await db
    .insert(farmPrintFiles)
    .values({ meshSha256, format: 'stl', bytes: built.stl.length, partSizesMm: built.partSizesMm })
    .onConflictDoNothing();
  return built.partSizesMm;
}

/**
 * Makes sure the farm holds the print file of a mesh hash: asks the farm first (it may have it from an earlier
 * upload), otherwise builds and uploads it; records the upload.
 * @param db - database
 * @param client - the farm client
 * @param meshSha256 - the pinned hash
 * @param sku - the variant's SKU
 */
export async function ensurePrintFile(db: Db, client: FarmClient, meshSha256: string, sku?: string): Promise<void> {
  const [known] = await db.select().from(farmPrintFiles).where(eq(farmPrintFiles.meshSha256, meshSha256));
  if (known?.uploadedAt && (await client.hasPrintFile(meshSha256))) return;
  if (!known?.uploadedAt && (await client.hasPrintFile(meshSha256))) {
    await markUploaded(db, meshSha256, known ? undefined : await buildPinned(db, meshSha256, sku));
    return;
  }
  const built = await buildPinned(db, meshSha256, sku);
  await client.putPrintFile(meshSha256, built.stl, 'stl');
  await markUploaded(db, meshSha256, built);
}

async function markUploaded(db: Db, meshSha256: string, built: BuiltFile | undefined): Promise<void> {
  const now = new Date();
  if (built)
    await db
      .insert(farmPrintFiles)
      .values({ meshSha256, format: 'stl', bytes: built.stl.length, partSizesMm: built.partSizesMm, uploadedAt: now })
      .onConflictDoUpdate({ target: farmPrintFiles.meshSha256, set: { uploadedAt: now } });
  else await db.update(farmPrintFiles).set({ uploadedAt: now }).where(eq(farmPrintFiles.meshSha256, meshSha256));
}
