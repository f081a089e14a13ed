/** Named queries about people: the only place that reads or writes the `people` table. */
import { asc, eq } from 'drizzle-orm';
import type { Person, PersonCreate, PersonUpdate, Role, StudioPerson } from '../../shared/schemas/auth';
import { hashPassword } from '../auth/password';
import { forgetSessions } from '../auth/sessionCache';
import type { Db, Queryable } from '../db/client';
import { people, studios, type PersonRow } from '../db/schema';
import { conflict, notFound } from '../http/HttpError';
import { recordAudit } from './audit';

/** A stored person as the API shows them (no password hash). @param row - the stored row */
export function toPerson(row: PersonRow): Person {
  return { id: row.id, email: row.email, name: row.name, roles: [...row.roles] };
}

/** A stored person as the admin's list shows them: also whether they may sign in. @param row - the stored row */
export function toStudioPerson(row: PersonRow): StudioPerson {
  return {
    ...toPerson(row),
    active: row.deactivatedAt === null,
    deactivatedAt: row.deactivatedAt?.toISOString() ?? null,
  };
}

/** The person with this e-mail (already normalised), or undefined. @param db - database @param email - e-mail */
export async function findPersonByEmail(db: Db, email: string): Promise<PersonRow | undefined> {
  const [row] = await db.select().from(people).where(eq(people.email, email));
  return row;
}

/** Everyone, by name. @param db - database */
export async function listPeople(db: Db): Promise<StudioPerson[]> {
  const rows = await db.select().from(people).orderBy(asc(people.name), asc(people.email));
  return rows.map(toStudioPerson);
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
): Promise<StudioPerson> {
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
    return toStudioPerson(row);
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
export async function updatePerson(
  db: Db,
  id: string,
  input: PersonUpdate,
  actorId: string | null,
): Promise<StudioPerson> {
  const person = await db.transaction(async (tx) => {
    const before = await personRow(tx, id);
    const roles = input.roles ? uniqueRoles(input.roles) : before.roles;
    if (before.roles.includes('admin') && !roles.includes('admin') && before.deactivatedAt === null)
      await requireAnotherActiveAdmin(tx, id, 'give the admin role to someone else first.');
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
    return toStudioPerson(after);
  });
  // Signed-in requests take the person's roles and name from the session memory: forget it.
  forgetSessions(db);
  return person;
}

/** The stored person, or 404. */
async function personRow(db: Queryable, id: string): Promise<PersonRow> {
  const [row] = await db.select().from(people).where(eq(people.id, id));
  if (!row) throw notFound('No person with this id.');
  return row;
}

/** 409 `last_admin` unless someone other than `id` is an active admin. */
async function requireAnotherActiveAdmin(db: Queryable, id: string, advice: string): Promise<void> {
  const rows = await db
    .select({ id: people.id, roles: people.roles, deactivatedAt: people.deactivatedAt })
    .from(people);
  if (!rows.some((row) => row.id !== id && row.deactivatedAt === null && row.roles.includes('admin')))
    throw conflict('last_admin', `The studio needs at least one active admin: ${advice}`);
}

/**
 * Switches a person off (they can no longer sign in) or on again, and logs it. Ending their sessions is the
 * caller's part (lucia owns the sessions). 409 `own_account` for one's own account, 409 `last_admin` when it would
 * leave no active admin.
 * @param db - database
 * @param id - the person
 * @param active - false to deactivate, true to reactivate
 * @param actorId - the admin acting
 */
export async function setPersonActive(db: Db, id: string, active: boolean, actorId: string): Promise<StudioPerson> {
  if (id === actorId && !active)
    throw conflict('own_account', 'You cannot deactivate your own account: ask another admin to do it.');
  return db.transaction(async (tx) => {
    const before = await personRow(tx, id);
    if ((before.deactivatedAt === null) === active) return toStudioPerson(before);
    if (!active && before.roles.includes('admin'))
      await requireAnotherActiveAdmin(tx, id, 'make someone else an admin first.');
    const [after] = await tx
      .update(people)
      .set({ deactivatedAt: active ? null : new Date(), updatedAt: new Date() })
      .where(eq(people.id, id))
      .returning();
    await recordAudit(tx, {
      actorId,
      action: active ? 'person.reactivated' : 'person.deactivated',
      subject: `person:${id}`,
    });
    return toStudioPerson(after);
  });
}

/**
 * Stores a new password for a person and logs who set it (the password itself is never logged). Ending their other
 * sessions is the caller's part.
 * @param db - database
 * @param id - the person
 * @param password - the new password, already checked
 * @param actorId - who set it (the person themselves or an admin)
 * @param action - `person.password_changed` (by themselves) or `person.password_reset` (by an admin)
 */
export async function setPassword(
  db: Db,
  id: string,
  password: string,
  actorId: string,
  action: 'person.password_changed' | 'person.password_reset',
): Promise<StudioPerson> {
  const passwordHash = await hashPassword(password);
  return db.transaction(async (tx) => {
    await personRow(tx, id);
    const [after] = await tx
      .update(people)
      .set({ passwordHash, updatedAt: new Date() })
      .where(eq(people.id, id))
      .returning();
    await recordAudit(tx, { actorId, action, subject: `person:${id}` });
    return toStudioPerson(after);
  });
}

function uniqueRoles(roles: Role[]): Role[] {
  return [...new Set(roles)];
}

function sameRoles(a: Role[], b: Role[]): boolean {
  return a.length === b.length && a.every((role) => b.includes(role));
}
