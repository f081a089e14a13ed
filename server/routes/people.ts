/** Admin people management: list, add, rename, set roles, deactivate and reactivate, reset a password. */
import { Router } from 'express';
import { z } from 'zod';
import {
  PersonCreateSchema,
  PersonUpdateSchema,
  type PasswordResetAnswer,
  type PersonCreate,
  type PersonUpdate,
  type StudioPerson,
} from '../../shared/schemas/auth';
import { generatePassword } from '../auth/generatePassword';
import { requireRole, signedInPerson } from '../auth/requireRole';
import type { AppContext } from '../context';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { createPerson, listPeople, setPassword, setPersonActive, updatePerson } from '../services/people';

/** `:id` of a person. */
const PersonParamsSchema = z.object({ id: z.string().min(1).max(64) });

/**
 * `/api/people` (admin only): `GET /` -> `{ people }`; `POST /` -> 201 `{ person }`; `PATCH /:id` -> `{ person }`
 * (name, roles); `POST /:id/deactivate` and `POST /:id/reactivate` -> `{ person }` (deactivating ends every session
 * of theirs); `POST /:id/reset-password` -> `{ person, password }`: a generated password, answered this once and never
 * stored in clear; their sessions end.
 * @param ctx - app context
 */
export function peopleRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    const body: { people: StudioPerson[] } = { people: await listPeople(ctx.db) };
    res.json(body);
  });

  router.post('/', validate({ body: PersonCreateSchema }), async (_req, res) => {
    const person = await createPerson(ctx.db, parsedBody<PersonCreate>(res), signedInPerson(res).id);
    res.status(201).json({ person });
  });

  router.patch('/:id', validate({ params: PersonParamsSchema, body: PersonUpdateSchema }), async (_req, res) => {
    const { id } = parsedParams<z.infer<typeof PersonParamsSchema>>(res);
    const person = await updatePerson(ctx.db, id, parsedBody<PersonUpdate>(res), signedInPerson(res).id);
    res.json({ person });
  });

  router.post('/:id/deactivate', validate({ params: PersonParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<z.infer<typeof PersonParamsSchema>>(res);
    const person = await setPersonActive(ctx.db, id, false, signedInPerson(res).id);
    await ctx.lucia.invalidateUserSessions(id);
    res.json({ person });
  });

  router.post('/:id/reactivate', validate({ params: PersonParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<z.infer<typeof PersonParamsSchema>>(res);
    res.json({ person: await setPersonActive(ctx.db, id, true, signedInPerson(res).id) });
  });

  router.post('/:id/reset-password', validate({ params: PersonParamsSchema }), async (_req, res) => {
    const { id } = parsedParams<z.infer<typeof PersonParamsSchema>>(res);
    const password = generatePassword();
    const person = await setPassword(ctx.db, id, password, signedInPerson(res).id, 'person.password_reset');
    await ctx.lucia.invalidateUserSessions(id);
    const body: PasswordResetAnswer = { person, password };
    res.json(body);
  });

  return router;
}
