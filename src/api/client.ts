import type { ZodType } from 'zod';
import { ApiErrorSchema } from '../../shared/schemas/error';
import { ApiError } from './ApiError';

export { ApiError };

/** Options for one API call. */
export interface ApiRequest<T> {
  /** HTTP method; GET by default. */
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** JSON body, sent with `Content-Type: application/json`; or a form (an upload), sent as multipart as it is. */
  body?: unknown;
  /** Schema that the answer must match; the parsed value is returned. */
  schema?: ZodType<T>;
  /** Abort signal. */
  signal?: AbortSignal;
}

let onUnauthorized: ((path: string) => void) | null = null;

/**
 * Registers what happens when a call answers 401 (the session expired or was ended elsewhere): main.ts clears the
 * session and sends the person to sign in. Not called for the sign-in and `me` calls, whose 401 is expected.
 * @param handler - receives the API path that answered 401
 */
export function setUnauthorizedHandler(handler: ((path: string) => void) | null): void {
  onUnauthorized = handler;
}

/**
 * Calls the Nestwright API: JSON in and out, same-origin cookies, error answers thrown as {@link ApiError}.
 * @param path - path under `/api`, e.g. `/auth/me`
 * @param request - method, body and the schema of the answer
 * @returns the answer parsed by `request.schema` (or `undefined` for an empty answer)
 */
export async function api<T = unknown>(path: string, request: ApiRequest<T> = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const form = request.body instanceof FormData ? request.body : null;
  if (request.body !== undefined && !form) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method: request.method ?? 'GET',
      headers,
      // A form sets its own multipart content type with its boundary.
      body: form ?? (request.body === undefined ? undefined : JSON.stringify(request.body)),
      credentials: 'same-origin',
      signal: request.signal,
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }
  const text = await res.text();
  let json: unknown = undefined;
  if (text) {
    try {
      json = JSON.parse(text);
    } catch {
      throw new ApiError(
        res.status,
        'bad_response',
        `The server sent an answer that is not JSON (HTTP ${res.status}).`,
      );
    }
  }
  if (!res.ok) {
    if (res.status === 401 && !path.startsWith('/auth/')) onUnauthorized?.(path);
    const retryAfterSec = parseRetryAfter(res.headers.get('Retry-After'));
    const parsed = ApiErrorSchema.safeParse(json);
    if (parsed.success) {
      const { code, message, details } = parsed.data.error;
      throw new ApiError(res.status, code, message, details, retryAfterSec);
    }
    throw new ApiError(res.status, 'http_error', `The server answered HTTP ${res.status}.`, undefined, retryAfterSec);
  }
  if (!request.schema) return json as T;
  const checked = request.schema.safeParse(json);
  if (!checked.success) {
    throw new ApiError(
      res.status,
      'bad_response',
      `The server's answer did not have the expected shape: ${checked.error.issues[0]?.message ?? 'unknown'}`,
    );
  }
  return checked.data;
}

/** Seconds from a `Retry-After` header (delta-seconds or an HTTP date); undefined when absent or unreadable. */
function parseRetryAfter(header: string | null): number | undefined {
  if (!header) return undefined;
  const seconds = Number(header);
  if (Number.isFinite(seconds)) return Math.max(0, seconds);
  const atMs = Date.parse(header);
  return Number.isNaN(atMs) ? undefined : Math.max(0, Math.round((atMs - Date.now()) / 1000));
}
