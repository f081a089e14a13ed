/**
 * An error answer from the API (`{ error: { code, message, details? } }`), or a network failure (status 0).
 */
export class ApiError extends Error {
  /** HTTP status; 0 when the server could not be reached. */
  readonly status: number;
  /** Machine-readable code from the server, e.g. `bad_request`, `unauthorized`, `rate_limited`. */
  readonly code: string;
  /** Extra detail from the server: for 400, a list of `{ path, message }`. */
  readonly details: unknown;
  /** Seconds until a retry may succeed, from the `Retry-After` header (429, 503); undefined when not sent. */
  readonly retryAfterSec: number | undefined;

  /**
   * @param status - HTTP status, 0 for network failures
   * @param code - error code from the server
   * @param message - human-readable message from the server
   * @param details - optional extra detail
   * @param retryAfterSec - seconds from the `Retry-After` header, if any
   */
  constructor(status: number, code: string, message: string, details?: unknown, retryAfterSec?: number) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
    this.retryAfterSec = retryAfterSec;
  }

  /** Field problems of a 400 answer, keyed by the dotted field path (`roles.0` -> `roles`'s first item). */
  get fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    if (!Array.isArray(this.details)) return out;
    for (const item of this.details as unknown[]) {
      if (!item || typeof item !== 'object') continue;
      const { path, message } = item as { path?: unknown; message?: unknown };
      const key = Array.isArray(path) ? path.join('.') : typeof path === 'string' ? path : '';
      if (key && typeof message === 'string' && !(key in out)) out[key] = message;
    }
    return out;
  }
}
