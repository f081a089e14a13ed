/**
 * Spec sheets kept as generated documents in the file store (`documents/spec-sheets/<hash>.pdf`, the local folder
 * or the S3 bucket): a sheet is rendered once for what it shows (the variants, the sales settings, the studio's name
 * and materials, the sample photo and the issue day) and then streamed from the store by whichever API process is asked, for staff and the shop
 * alike. Anything the sheet shows changes the hash, so a changed variant or setting gets a new document.
 */
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { AppContext } from '../context';
import { HttpError } from '../http/HttpError';
import { fileKey, type StoredFile } from '../storage/FileStore';
import { readPhoto } from './photoService';
import { getSalesSettings } from './salesSettings';
import { renderSpecSheets } from './specSheet';
import { documentFacts } from './studio';
import { isoDay } from '../../shared/format';

/** Raise when the sheet's layout changes, so documents stored by an earlier version are not served again. */
export const SPEC_SHEET_LAYOUT_VERSION = 2;

/**
 * The spec sheet of some published variants (one document, pages in order), opened for streaming: from the file
 * store, or rendered and stored first.
 * @param ctx - app context
 * @param variants - published catalogue variants (at least one; the first one's family photo is shown)
 * @param issuedOn - the day printed on the sheet (default today)
 */
export async function openSpecSheet(
  ctx: AppContext,
  variants: CatalogueVariant[],
  issuedOn: Date = new Date(),
): Promise<StoredFile> {
  const { settings } = await getSalesSettings(ctx.db);
  const { studioName, locale, materials } = await documentFacts(ctx.db);
  const day = isoDay(issuedOn);
  // Only the materials the variants use are part of what the sheet shows.
  const used = [...new Set(variants.map((v) => v.attributes.material))].sort().map((id) => materials.get(id) ?? id);
  const hash = createHash('sha256')
    .update(JSON.stringify({ layout: SPEC_SHEET_LAYOUT_VERSION, day, settings, studioName, locale, used, variants }))
    .digest('hex');
  const key = fileKey('documents', `spec-sheets/${hash}.pdf`);
  const stored = await ctx.files.open(key);
  if (stored) return stored;
  const pdf = await renderSpecSheets(variants, {
    settings,
    studioName,
    locale,
    materials,
    issuedOn,
    photo: await samplePhoto(ctx, variants[0]),
  });
  await ctx.files.put(key, pdf, 'application/pdf');
  return { body: Readable.from([pdf]), sizeBytes: pdf.length, contentType: 'application/pdf' };
}

/** The family's first sample-print photo, or undefined (then the sheet shows a rendered view). */
async function samplePhoto(ctx: AppContext, variant: CatalogueVariant): Promise<Buffer | undefined> {
  const photo = variant.photos[0];
  if (!photo) return undefined;
  try {
    return await readPhoto(ctx, photo.id, 'normal');
  } catch (err) {
    // A photo row whose file is gone: the sheet falls back to the rendered view rather than failing.
    if (err instanceof HttpError && err.status === 404) return undefined;
    throw err;
  }
}
