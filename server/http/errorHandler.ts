/** The one error middleware: every failure becomes `{ error: { code, message, details? } }`, never a stack trace. */
import type { ErrorRequestHandler } from 'express';
import type { ApiError } from '../../shared/schemas/error';
import { HttpError } from './HttpError';

/** body-parser error types and the answer each one gets. */
const BODY_ERRORS: Record<string, { code: string; message: string }> = {
  'entity.parse.failed': { code: 'bad_json', message: 'The request body is not valid JSON.' },
  'entity.too.large': { code: 'payload_too_large', message: 'The request body is too large.' },
  'encoding.unsupported': { code: 'unsupported_encoding', message: 'The request body encoding is not supported.' },
  'charset.unsupported': { code: 'unsupported_charset', message: 'The request body charset is not supported.' },
  'request.aborted': { code: 'request_aborted', message: 'The request was aborted.' },
};

/** Shape of the errors body-parser and http-errors throw. */
interface ExposedError {
  status?: number;
  type?: string;
  expose?: boolean;
}

/**
 * Builds the error middleware.
 * @param logError - where unexpected (500) errors are reported with their stack
 */
export function errorHandler(logError: (err: unknown) => void): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    let status = 500;
    let body: ApiError = { error: { code: 'internal', message: 'Something went wrong on our side.' } };
    if (err instanceof HttpError) {
      status = err.status;
      body = { error: { code: err.code, message: err.message } };
      if (err.details !== undefined) body.error.details = err.details;
    } else if (isExposed(err)) {
      status = err.status ?? 400;
      body = {
        error: BODY_ERRORS[err.type ?? ''] ?? { code: 'bad_request', message: 'The request was not understood.' },
      };
    } else {
      logError(err);
    }
    res.status(status).json(body);
  };
}

function isExposed(err: unknown): err is ExposedError {
  if (typeof err !== 'object' || err === null) return false;
  const { status, expose } = err as ExposedError;
  return expose === true && typeof status === 'number' && status >= 400 && status < 500;
}
