/** Admin people management: list, add, rename and set roles. */
import { Router } from 'express';
import { z } from 'zod';
import {
  PersonCreateSchema,
  PersonUpdateSchema,
  type Person,
  type PersonCreate,
  type PersonUpdate,
} from '../../shared/schemas/auth';
import { requireRole, signedInPerson } from '../auth/requireRole';
import type { AppContext } from '../context';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { createPerson, listPeople, updatePerson } from '../services/people';

/** `:id` of a person. */
const PersonParamsSchema = z.object({ id: z.string().min(1).max(64) });

/**
 * `/api/people` (admin only): `GET /` -> `{ people }`; `POST /` -> 201 `{ person }`; `PATCH /:id` -> `{ person }`.
 * @param ctx - app context
 */
export function peopleRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    const body: { people: Person[] } = { people: await listPeople(ctx.db) };
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

  return router;
}
