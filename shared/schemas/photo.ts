/**
 * Photos of printed samples.
 *
 * Routes: `POST /api/families/:id/photos` (designer; multipart/form-data field `photo`, JPEG/PNG/WebP, at most
 * {@link PHOTO_MAX_BYTES} bytes, checked by content, and optional field `caption`) -> 201 {@link PhotoResponse};
 * `GET /api/photos/:id` (the 1600 px normalised copy) and `GET /api/photos/:id/thumb` (the 320 px thumbnail), both
 * image/webp for anyone signed in.
 */
import { z } from 'zod';
import { ActorSchema } from './review';

/** Largest photo upload in bytes (8 MB). */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;

/** Longest side of a photo thumbnail, px. */
export const PHOTO_THUMB_PX = 320;

/** Longest side of the normalised photo copy, px. */
export const PHOTO_NORMAL_PX = 1600;

/** A photo of a printed sample. */
export const PhotoSchema = z.object({
  id: z.string(),
  familyId: z.string(),
  caption: z.string(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  /** Content type detected on upload (image/jpeg, image/png, image/webp). */
  originalType: z.string(),
  uploadedBy: ActorSchema,
  createdAt: z.string(),
  /** `/api/photos/<id>` */
  url: z.string(),
  /** `/api/photos/<id>/thumb` */
  thumbUrl: z.string(),
});
/** A photo (see {@link PhotoSchema}). */
export type Photo = z.infer<typeof PhotoSchema>;

/** Answer of `POST /api/families/:id/photos`. */
export const PhotoResponseSchema = z.object({ photo: PhotoSchema });
/** Answer of `POST /api/families/:id/photos`. */
export type PhotoResponse = z.infer<typeof PhotoResponseSchema>;
