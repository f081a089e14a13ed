/** Named queries about people: the only place that reads or writes the `people` table. */
import { asc, eq } from 'drizzle-orm';
import type { Person, PersonCreate, PersonUpdate, Role } from '../../shared/schemas/auth';
import { hashPassword } from '../auth/password';
import type { Db, Queryable } from '../db/client';
import { people, studios, type PersonRow } from '../db/schema';
import { conflict, notFound } from '../http/HttpError';
import { recordAudit } from './audit';

/** A stored person as the API shows them (no password hash). @param row - the stored row */
export function toPerson(row: PersonRow): Person {
  return { id: row.id, email: row.email, name: row.name, roles: [...row.roles] };
}

/** The person with this e-mail (already normalised), or undefined. @param db - database @param email - e-mail */
export async function findPersonByEmail(db: Db, email: string): Promise<PersonRow | undefined> {
  const [row] = await db.select().from(people).where(eq(people.email, email));
  return row;
}

/** Everyone, by name. @param db - database */
export async function listPeople(db: Db): Promise<Person[]> {
  const rows = await db.select().from(people).orderBy(asc(people.name), asc(people.email));
  return rows.map(toPerson);
}

/** The studio new people join: the first one, created under `defaultName` when there is none. */
async function defaultStudioId(db: Queryable, defaultName: string): Promise<string> {
  const [studio] = await db.select({ id: studios.id }).from(studios).orderBy(asc(studios.createdAt)).limit(1);
  if (studio) return studio.id;
  const [created] = await db.insert(studios).values({ name: defaultName }).returning({ id: studios.id });
  return created.id;
}

/**
 * Adds a person (409 `email_taken` when the e-mail is in use) and logs it.
 * @param db - database
 * @param input - validated create body
 * @param actorId - who adds them (null for the CLI or seeding)
 * @param studioId - the studio; the first studio by default
 */
export async function createPerson(
  db: Db,
  input: PersonCreate,
  actorId: string | null,
  studioId?: string,
): Promise<Person> {
  if (await findPersonByEmail(db, input.email))
    throw conflict('email_taken', `The e-mail address ${input.email} is already in use.`);
  const passwordHash = await hashPassword(input.password);
  const roles = uniqueRoles(input.roles);
  const created = db.transaction(async (tx) => {
    const studio = studioId ?? (await defaultStudioId(tx, 'My studio'));
    const [row] = await tx
      .insert(people)
      .values({ email: input.email, name: input.name, passwordHash, roles, studioId: studio })
      .returning();
    await recordAudit(tx, {
      actorId,
      action: 'person.created',
      subject: `person:${row.id}`,
      details: { email: row.email, roles },
    });
    return toPerson(row);
  });
  return created.catch((err: unknown) => {
    // Two requests for the same e-mail can both pass the check above; the unique index decides.
    if (isUniqueViolation(err)) throw conflict('email_taken', `The e-mail address ${input.email} is already in use.`);
    throw err;
  });
}

/** Postgres "unique_violation" (23505), possibly wrapped by Drizzle. */
function isUniqueViolation(err: unknown): boolean {
  for (let e: unknown = err; typeof e === 'object' && e !== null; e = (e as { cause?: unknown }).cause)
    if ((e as { code?: unknown }).code === '23505') return true;
  return false;
}

/**
 * Changes a person's name and/or roles (404 when unknown; 409 `last_admin` when it would leave nobody an admin)
 * and logs role changes.
 * @param db - database
 * @param id - the person
 * @param input - validated update body
 * @param actorId - who makes the change
 */
export async function updatePerson(db: Db, id: string, input: PersonUpdate, actorId: string | null): Promise<Person> {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(people).where(eq(people.id, id));
    if (!before) throw notFound('No person with this id.');
    const roles = input.roles ? uniqueRoles(input.roles) : before.roles;
    if (before.roles.includes('admin') && !roles.includes('admin')) {
      const admins = await tx.select({ roles: people.roles }).from(people);
      if (admins.filter((row) => row.roles.includes('admin')).length <= 1)
        throw conflict('last_admin', 'The studio needs at least one admin: give the admin role to someone else first.');
    }
    const [after] = await tx
      .update(people)
      .set({ name: input.name ?? before.name, roles, updatedAt: new Date() })
      .where(eq(people.id, id))
      .returning();
    if (!sameRoles(before.roles, roles)) {
      await recordAudit(tx, {
        actorId,
        action: 'person.roles_changed',
        subject: `person:${id}`,
        details: { before: before.roles, after: roles },
      });
    }
    if (after.name !== before.name) {
      await recordAudit(tx, {
        actorId,
        action: 'person.renamed',
        subject: `person:${id}`,
        details: { before: before.name, after: after.name },
      });
    }
    return toPerson(after);
  });
}

function uniqueRoles(roles: Role[]): Role[] {
  return [...new Set(roles)];
}

function sameRoles(a: Role[], b: Role[]): boolean {
  return a.length === b.length && a.every((role) => b.includes(role));
}
