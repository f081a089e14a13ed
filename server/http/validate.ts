/** Validate once in middleware, keep the parsed result on res.locals; handlers read only the parsed values. */
import type { RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { badRequest } from './HttpError';
import { asSentence } from '../../shared/schemas/humanMessages';

/** The schemas one route validates. */
export interface ValidateSchemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

type Part = keyof ValidateSchemas;

/** One failing field as reported in `details`. */
export interface FieldIssue {
  /** Where the field is: `body`, `query` or `params`. */
  in: Part;
  /** Dotted path inside that part, e.g. `roles.0`; empty for the whole part. */
  path: string;
  message: string;
}

/**
 * Middleware that parses `req.body`, `req.query` and `req.params` with the given zod schemas.
 * Bad input answers 400 `bad_request` with the first problem as a sentence naming the field by its label (see
 * shared/schemas/humanMessages.ts) and every failing field, by path, in `details`.
 * @param schemas - the schema for each part to check
 */
export function validate(schemas: ValidateSchemas): RequestHandler {
  return (req, res, next) => {
    const issues: FieldIssue[] = [];
    const parsed: Partial<Record<Part, unknown>> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input: unknown = req[part];
      const result = schema.safeParse(input);
      if (result.success) parsed[part] = result.data;
      else
        for (const issue of result.error.issues)
          issues.push({ in: part, path: issue.path.map(String).join('.'), message: asSentence(issue.message) });
    }
    if (issues.length > 0) {
      const first = issues[0];
      throw badRequest(first.message, issues);
    }
    res.locals.parsed = parsed;
    next();
  };
}

function parsedPart<T>(res: Response, part: Part): T {
  const parsed = res.locals.parsed as Partial<Record<Part, unknown>> | undefined;
  if (!parsed || !(part in parsed)) throw new Error(`No validated ${part} on this route: add validate({ ${part} })`);
  return parsed[part] as T;
}

/** The body parsed by {@link validate}. @param res - the response of the current request */
export const parsedBody = <T>(res: Response): T => parsedPart<T>(res, 'body');
/** The query parsed by {@link validate}. @param res - the response of the current request */
export const parsedQuery = <T>(res: Response): T => parsedPart<T>(res, 'query');
/** The route params parsed by {@link validate}. @param res - the response of the current request */
export const parsedParams = <T>(res: Response): T => parsedPart<T>(res, 'params');
