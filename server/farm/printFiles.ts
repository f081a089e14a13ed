/**
 * Print files of published variants: the mesh is rebuilt from the variant's template and parameters and must give
 * the same mesh hash the variant was published (and sold) with. The binary STL is kept in the file store
 * (`print-files/<hash>.stl`, the local folder or the S3 bucket), so any process sends or serves it without building
 * it again; it goes to the farm once per hash, and the part sizes are kept for the run planner.
 */
import { and, eq } from 'drizzle-orm';
import { partSizesMm } from '../../shared/analysis/fitParts';
import { writeStl } from '../../shared/mesh/writeStl';
import { generate } from '../../templates/generate';
import type { Db } from '../db/client';
import { familyRevisions, familyVariants, farmPrintFiles } from '../db/schema';
import { fileKey, type FileStore, type StoredFile } from '../storage/FileStore';
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

/** Content type of a binary STL. */
const STL_TYPE = 'model/stl';

/**
 * The store key of a mesh hash's print file.
 * @param meshSha256 - the pinned hash (64 hex digits)
 */
export function printFileKey(meshSha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(meshSha256)) throw new PinnedMeshError('a print file is named by a 64-digit mesh hash');
  return fileKey('print-files', `${meshSha256}.stl`);
}

/** Builds the print file of a hash (checking the hash) and keeps it in the file store. */
async function buildAndStore(db: Db, files: FileStore, meshSha256: string, sku?: string): Promise<BuiltFile> {
  const built = await buildPinned(db, meshSha256, sku);
  await files.put(printFileKey(meshSha256), built.stl, STL_TYPE);
  return built;
}

/**
 * Part sizes of a variant's mesh, measured once and kept (building takes a second or two; the print file built on
 * the way is stored too).
 * @param db - database
 * @param files - the file store
 * @param meshSha256 - the variant's mesh hash
 * @param sku - its SKU
 */
export async function partSizesOf(
  db: Db,
  files: FileStore,
  meshSha256: string,
  sku?: string,
): Promise<Array<[number, number, number]>> {
  const [known] = await db.select().from(farmPrintFiles).where(eq(farmPrintFiles.meshSha256, meshSha256));
  if (known) return known.partSizesMm;
  const built = await buildAndStore(db, files, meshSha256, sku);
  await db
    .insert(farmPrintFiles)
    .values({ meshSha256, format: 'stl', bytes: built.stl.length, partSizesMm: built.partSizesMm })
    .onConflictDoNothing();
  return built.partSizesMm;
}

/**
 * The print file of a mesh hash opened for streaming: from the file store, or built (hash checked), stored and then
 * opened when it is not there yet.
 * @param db - database
 * @param files - the file store
 * @param meshSha256 - the pinned hash
 * @param sku - the variant's SKU
 * @throws PinnedMeshError when no variant has this hash or its mesh no longer builds to it
 */
export async function openPrintFile(db: Db, files: FileStore, meshSha256: string, sku?: string): Promise<StoredFile> {
  const key = printFileKey(meshSha256);
  const stored = await files.open(key);
  if (stored) return stored;
  const built = await buildAndStore(db, files, meshSha256, sku);
  await db
    .insert(farmPrintFiles)
    .values({ meshSha256, format: 'stl', bytes: built.stl.length, partSizesMm: built.partSizesMm })
    .onConflictDoNothing();
  const opened = await files.open(key);
  if (!opened) throw new Error(`The print file ${key} was stored but cannot be read back.`);
  return opened;
}

/**
 * Makes sure the farm holds the print file of a mesh hash: asks the farm first (it may have it from an earlier
 * upload), otherwise uploads the stored file (built and stored first when there is none); records the upload.
 * @param db - database
 * @param files - the file store
 * @param client - the farm client
 * @param meshSha256 - the pinned hash
 * @param sku - the variant's SKU
 */
export async function ensurePrintFile(
  db: Db,
  files: FileStore,
  client: FarmClient,
  meshSha256: string,
  sku?: string,
): Promise<void> {
  const [known] = await db.select().from(farmPrintFiles).where(eq(farmPrintFiles.meshSha256, meshSha256));
  if (known?.uploadedAt && (await client.hasPrintFile(meshSha256))) return;
  if (!known?.uploadedAt && (await client.hasPrintFile(meshSha256))) {
    await markUploaded(db, meshSha256, known ? undefined : await buildAndStore(db, files, meshSha256, sku));
    return;
  }
  const stored = known ? await files.read(printFileKey(meshSha256)) : null;
  if (stored) {
    await client.putPrintFile(meshSha256, new Uint8Array(stored), 'stl');
    await markUploaded(db, meshSha256, undefined);
    return;
  }
  const built = await buildAndStore(db, files, meshSha256, sku);
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
