import { ApiErrorSchema } from '../../shared/schemas/error';
import { PHOTO_MAX_BYTES, PhotoResponseSchema, type Photo } from '../../shared/schemas/photo';
import { ApiError } from './ApiError';

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
  let res: Response;
  try {
    res = await fetch(`/api/families/${encodeURIComponent(familyId)}/photos`, {
      method: 'POST',
      body: form,
      credentials: 'same-origin',
      headers: { Accept: 'application/json' },
      signal,
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }
  const json: unknown = await res.json().catch(() => undefined);
  if (!res.ok) {
    const parsed = ApiErrorSchema.safeParse(json);
    if (parsed.success)
      throw new ApiError(res.status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.details);
    throw new ApiError(res.status, 'http_error', `The server answered HTTP ${res.status}.`);
  }
  const checked = PhotoResponseSchema.safeParse(json);
  if (!checked.success)
    throw new ApiError(res.status, 'bad_response', 'The server answered the upload with an unexpected shape.');
  return checked.data.photo;
}
