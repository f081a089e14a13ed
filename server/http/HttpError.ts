/** Typed HTTP errors: throw one anywhere in a route; the error middleware answers with the one error shape. */

/** An error that becomes `{ error: { code, message, details? } }` with the given status. */
export class HttpError extends Error {
  /**
   * @param status - HTTP status code
   * @param code - stable machine-readable code, e.g. `bad_request`
   * @param message - human-readable message, safe to show
   * @param details - optional structured details (e.g. the failing fields)
   */
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

/** 400 `bad_request`. @param message - what is wrong, naming the field @param details - per-field details */
export const badRequest = (message: string, details?: unknown): HttpError =>
  new HttpError(400, 'bad_request', message, details);
/**
 * 400 `bad_request` about one field: the sentence is the message and, in `details`, the problem of that field (so a
 * form shows it beside the field). The sentence is written for people and never starts with the field's key.
 * @param path - dotted path of the field in the body, e.g. `items.0.quantity`
 * @param message - what is wrong and what to do, as a sentence
 */
export const fieldProblem = (path: string, message: string): HttpError =>
  badRequest(message, [{ in: 'body', path, message }]);
/** 401 `unauthenticated`. @param message - what to tell the caller */
export const unauthorized = (message = 'Sign in first.'): HttpError => new HttpError(401, 'unauthenticated', message);
/** 403 `forbidden`. @param message - what to tell the caller */
export const forbidden = (message = 'Your role does not allow this.'): HttpError =>
  new HttpError(403, 'forbidden', message);
/** 404 `not_found`. @param message - what was not found */
export const notFound = (message = 'Not found.'): HttpError => new HttpError(404, 'not_found', message);
/** 409 with a specific code. @param code - e.g. `email_taken` @param message - what conflicts */
export const conflict = (code: string, message: string): HttpError => new HttpError(409, code, message);
