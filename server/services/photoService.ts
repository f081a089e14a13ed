/** Photos of printed samples: checked by content, normalised and thumbnailed with sharp, kept in the file store. */
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { OutputInfo } from 'sharp';
import { PHOTO_NORMAL_PX, PHOTO_THUMB_PX, type Photo } from '../../shared/schemas/photo';
import type { Person } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { familyPhotos, families } from '../db/schema';
import { fileKey, readAll, type StoredFile } from '../storage/FileStore';
import { notFound, fieldProblem } from '../http/HttpError';
import { recordAudit } from './audit';
import { catalogueChanged } from './catalogueCache';
import { familySubject } from './families/loadFamily';
import { toPhoto } from './familyView';

/** Image types a photo may be, recognised by their first bytes. */
export type PhotoType = 'image/jpeg' | 'image/png' | 'image/webp';

/**
 * The image type of a file by its content (magic bytes), or null: JPEG `FF D8 FF`, PNG `89 50 4E 47 0D 0A 1A 0A`,
 * WebP `RIFF....WEBP`. The file name and the declared type are never trusted.
 * @param bytes - the uploaded file
 */
export function detectPhotoType(bytes: Uint8Array): PhotoType | null {
  const starts = (offset: number, ...values: number[]) => values.every((value, i) => bytes[offset + i] === value);
  if (bytes.length >= 3 && starts(0, 0xff, 0xd8, 0xff)) return 'image/jpeg';
  if (bytes.length >= 8 && starts(0, 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return 'image/png';
  if (bytes.length >= 12 && starts(0, 0x52, 0x49, 0x46, 0x46) && starts(8, 0x57, 0x45, 0x42, 0x50)) return 'image/webp';
  return null;
}

/** Largest decoded image accepted (pixels), against decompression bombs. */
const MAX_INPUT_PIXELS = 40_000_000;

/**
 * Checks, converts and stores one photo for a family: a 1600 px WebP copy (EXIF orientation applied, metadata
 * dropped) and a 320 px thumbnail, under random file names.
 * @param ctx - app context
 * @param person - the uploader
 * @param familyId - the family
 * @param file - the uploaded bytes
 * @param caption - optional caption
 * @throws 400 `bad_request` naming `photo` when the content is not a JPEG, PNG or WebP image
 */
export async function addPhoto(
  ctx: AppContext,
  person: Person,
  familyId: string,
  file: Buffer,
  caption: string,
): Promise<Photo> {
  const [family] = await ctx.db.select({ id: families.id }).from(families).where(eq(families.id, familyId));
  if (!family) throw notFound('No such family.');
  const type = detectPhotoType(file);
  if (!type)
    throw fieldProblem('photo', 'This file is not a JPEG, PNG or WebP image (checked by its content): choose a photo.');
  let normal: { data: Buffer; info: OutputInfo };
  let thumb: Buffer;
  // Loaded on first use: the package takes a noticeable part of the server's start-up to load.
  const { default: sharp } = await import('sharp');
  try {
    const image = sharp(file, { limitInputPixels: MAX_INPUT_PIXELS }).rotate();
    normal = await image
      .clone()
      .resize(PHOTO_NORMAL_PX, PHOTO_NORMAL_PX, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer({ resolveWithObject: true });
    thumb = await image
      .clone()
      .resize(PHOTO_THUMB_PX, PHOTO_THUMB_PX, { fit: 'inside' })
      .webp({ quality: 75 })
      .toBuffer();
  } catch (err) {
    throw fieldProblem(
      'photo',
      `The image could not be read (${(err as Error).message}): try another copy of the photo.`,
    );
  }
  const fileName = `${randomBytes(16).toString('hex')}.webp`;
  const thumbFileName = `${randomBytes(16).toString('hex')}.webp`;
  await ctx.files.put(fileKey('photos', fileName), normal.data, 'image/webp');
  await ctx.files.put(fileKey('photos', thumbFileName), thumb, 'image/webp');
  try {
    const [row] = await ctx.db.transaction(async (tx) => {
      const inserted = await tx
        .insert(familyPhotos)
        .values({
          familyId,
          caption,
          widthPx: normal.info.width,
          heightPx: normal.info.height,
          originalType: type,
          fileName,
          thumbFileName,
          uploadedBy: person.id,
        })
        .returning();
      await recordAudit(tx, {
        actorId: person.id,
        action: 'family.photo_added',
        subject: familySubject(familyId),
        details: { photoId: inserted[0].id, caption, type },
      });
      return inserted;
    });
    catalogueChanged(ctx.db);
    return toPhoto(row, { id: person.id, name: person.name });
  } catch (err) {
    await ctx.files.remove(fileKey('photos', fileName));
    await ctx.files.remove(fileKey('photos', thumbFileName));
    throw err;
  }
}

/**
 * A stored photo (normalised copy or thumbnail, always WebP) opened for streaming.
 * @param ctx - app context
 * @param id - photo id
 * @param size - `normal` or `thumb`
 * @throws 404 when there is no such photo or its file is gone
 */
export async function openPhoto(ctx: AppContext, id: string, size: 'normal' | 'thumb'): Promise<StoredFile> {
  const [row] = await ctx.db.select().from(familyPhotos).where(eq(familyPhotos.id, id));
  if (!row) throw notFound('No such photo.');
  const file = await ctx.files.open(fileKey('photos', size === 'thumb' ? row.thumbFileName : row.fileName));
  if (!file) throw notFound('The photo file is missing.');
  return file;
}

/**
 * The bytes of a stored photo (documents that embed it).
 * @param ctx - app context
 * @param id - photo id
 * @param size - `normal` or `thumb`
 * @throws 404 when there is no such photo or its file is gone
 */
export async function readPhoto(ctx: AppContext, id: string, size: 'normal' | 'thumb'): Promise<Buffer> {
  return readAll((await openPhoto(ctx, id, size)).body);
}
