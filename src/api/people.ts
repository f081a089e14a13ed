import { z } from 'zod';
import {
  PasswordResetAnswerSchema,
  StudioPersonSchema,
  type PasswordResetAnswer,
  type PersonCreate,
  type PersonUpdate,
  type StudioPerson,
} from '../../shared/schemas/auth';
import { api } from './client';

/** Answer of `GET /api/people`. */
const PeopleListSchema = z.object({ people: z.array(StudioPersonSchema) });
/** Answer of `POST /api/people` and `PATCH /api/people/:id`. */
const PersonAnswerSchema = z.object({ person: StudioPersonSchema });

/**
 * Every person of the studio (admin only).
 * @returns people sorted as the server sends them
 */
export async function listPeople(): Promise<StudioPerson[]> {
  return (await api('/people', { schema: PeopleListSchema })).people;
}

/**
 * Adds a person (admin only).
 * @param input - name, e-mail, roles and initial password
 * @returns the new person
 */
export async function createPerson(input: PersonCreate): Promise<StudioPerson> {
  return (await api('/people', { method: 'POST', body: input, schema: PersonAnswerSchema })).person;
}

/**
 * Changes a person's name or roles (admin only).
 * @param id - the person's id
 * @param patch - the fields to change
 * @returns the updated person
 */
export async function updatePerson(id: string, patch: PersonUpdate): Promise<StudioPerson> {
  return (await api(`/people/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: PersonAnswerSchema }))
    .person;
}

/**
 * Deactivates a person (they cannot sign in; their sessions end) or reactivates them (admin only).
 * @param id - the person's id
 * @param active - false to deactivate, true to reactivate
 * @returns the updated person
 */
export async function setPersonActive(id: string, active: boolean): Promise<StudioPerson> {
  const action = active ? 'reactivate' : 'deactivate';
  return (await api(`/people/${encodeURIComponent(id)}/${action}`, { method: 'POST', schema: PersonAnswerSchema }))
    .person;
}

/**
 * Gives a person a new generated password (admin only); it is answered this once.
 * @param id - the person's id
 * @returns the person and the new password
 */
export function resetPassword(id: string): Promise<PasswordResetAnswer> {
  return api(`/people/${encodeURIComponent(id)}/reset-password`, { method: 'POST', schema: PasswordResetAnswerSchema });
}
