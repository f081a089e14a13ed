import { ApiErrorSchema } from '../../shared/schemas/error';
import { ApiError } from './ApiError';

/** A file the server answered with. */
export interface FetchedFile {
  blob: Blob;
  /** The name from the `Content-Disposition` header; null when the server did not name the file. */
  fileName: string | null;
  /** The answer's headers, for callers that read more of them. */
  headers: Headers;
}

/**
 * Fetches a file from the server (same-origin cookies); a failed connection or an error answer is thrown as
 * {@link ApiError}, with the server's error body when it sent one.
 * @param url - full URL path, e.g. `/api/price-list.csv`
 * @param init - method, headers and body of the request
 */
export async function fetchFile(url: string, init: RequestInit = {}): Promise<FetchedFile> {
  let res: Response;
  try {
    res = await fetch(url, { ...init, credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }
  if (!res.ok) {
    const parsed = ApiErrorSchema.safeParse(await res.json().catch(() => null));
    if (parsed.success) {
      const { code, message, details } = parsed.data.error;
      throw new ApiError(res.status, code, message, details);
    }
    throw new ApiError(res.status, 'http_error', `The server answered HTTP ${res.status}.`);
  }
  const disposition = res.headers.get('Content-Disposition') ?? '';
  const named = /filename="?([^";]+)"?/.exec(disposition)?.[1];
  return { blob: await res.blob(), fileName: named ?? null, headers: res.headers };
}
