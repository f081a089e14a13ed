/** Route guards: 401 when signed out, 403 when the person lacks every allowed role. */
import type { RequestHandler, Response } from 'express';
import type { Person, Role } from '../../shared/schemas/auth';
import { forbidden, unauthorized } from '../http/HttpError';

/** The signed-in person, or undefined. @param res - the response of the current request */
export function currentPerson(res: Response): Person | undefined {
  return res.locals.person as Person | undefined;
}

/** The signed-in person; throws 401 when nobody is signed in. @param res - the response of the current request */
export function signedInPerson(res: Response): Person {
  const person = currentPerson(res);
  if (!person) throw unauthorized();
  return person;
}

/** 401 unless somebody is signed in. */
export const requireAuth: RequestHandler = (_req, res, next) => {
  signedInPerson(res);
  next();
};

/**
 * 401 when signed out, 403 unless the person holds at least one of the roles. Admin does NOT imply other roles.
 * @param roles - the roles allowed
 */
export function requireRole(...roles: Role[]): RequestHandler {
  return (_req, res, next) => {
    const person = signedInPerson(res);
    if (!person.roles.some((role) => roles.includes(role))) throw forbidden();
    next();
  };
}
