import { z } from 'zod';
import { PersonSchema, type Person, type PersonCreate, type PersonUpdate } from '../../shared/schemas/auth';
import { api } from './client';

/** Answer of `GET /api/people`. */
const PeopleListSchema = z.object({ people: z.array(PersonSchema) });
/** Answer of `POST /api/people` and `PATCH /api/people/:id`. */
const PersonAnswerSchema = z.object({ person: PersonSchema });

/**
 * Every person of the studio (admin only).
 * @returns people sorted as the server sends them
 */
export async function listPeople(): Promise<Person[]> {
  return (await api('/people', { schema: PeopleListSchema })).people;
}

/**
 * Adds a person (admin only).
 * @param input - name, e-mail, roles and initial password
 * @returns the new person
 */
export async function createPerson(input: PersonCreate): Promise<Person> {
  return (await api('/people', { method: 'POST', body: input, schema: PersonAnswerSchema })).person;
}

/**
 * Changes a person's name or roles (admin only).
 * @param id - the person's id
 * @param patch - the fields to change
 * @returns the updated person
 */
export async function updatePerson(id: string, patch: PersonUpdate): Promise<Person> {
  return (await api(`/people/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: PersonAnswerSchema }))
    .person;
}
