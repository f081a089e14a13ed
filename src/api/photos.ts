import { PHOTO_MAX_BYTES, PhotoResponseSchema, type Photo } from '../../shared/schemas/photo';
import { api, ApiError } from './client';

/** Content types the server accepts for photos (it checks the bytes, this only spares a pointless upload). */
export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp';

/**
 * Uploads a photo of a printed sample to a family as multipart/form-data (field `photo`, optional `caption`).
 * Files larger than the limit are refused here before any bytes are sent.
 * @param familyId - family id
 * @param file - the image file
 * @param caption - optional caption
 * @param signal - abort signal
 */
export async function uploadPhoto(familyId: string, file: Blob, caption = '', signal?: AbortSignal): Promise<Photo> {
  if (file.size > PHOTO_MAX_BYTES) {
    const limitMb = PHOTO_MAX_BYTES / (1024 * 1024);
    throw new ApiError(
      413,
      'too_large',
      `The photo is ${(file.size / 1048576).toFixed(1)} MB; at most ${limitMb} MB is accepted.`,
    );
  }
  const form = new FormData();
  form.append('photo', file, file instanceof File ? file.name : 'photo');
  if (caption) form.append('caption', caption);
  const answer = await api(`/families/${encodeURIComponent(familyId)}/photos`, {
    method: 'POST',
    body: form,
    schema: PhotoResponseSchema,
    signal,
  });
  return answer.photo;
}
