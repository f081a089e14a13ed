/** The studio's name: kept in the `studios` table, shown by the app's header, documents and mails. */
import { asc, eq } from 'drizzle-orm';
import type { Queryable } from '../db/client';
import { studios } from '../db/schema';
import type { Material } from '../../shared/schemas/production';
import { recordAudit } from './audit';
import { loadMaterials } from './familyProduction';

/** The name used until a studio exists (a database that was migrated but never seeded). */
export const FALLBACK_STUDIO_NAME = 'Fernhollow Studio';

/**
 * The studio's name: the first studio's (a database holds one studio), or the fallback when there is none yet.
 * @param db - database
 */
export async function getStudioName(db: Queryable): Promise<string> {
  const [studio] = await db.select({ name: studios.name }).from(studios).orderBy(asc(studios.createdAt)).limit(1);
  return studio?.name ?? FALLBACK_STUDIO_NAME;
}

/**
 * Renames the studio (creating it when the database has none) and records who did it.
 * @param db - database
 * @param name - the new name (validated by the route)
 * @param actorId - who renamed it
 * @returns the saved name
 */
export async function saveStudioName(db: Queryable, name: string, actorId: string): Promise<string> {
  const [studio] = await db.select().from(studios).orderBy(asc(studios.createdAt)).limit(1);
  if (studio) await db.update(studios).set({ name, updatedAt: new Date() }).where(eq(studios.id, studio.id));
  else await db.insert(studios).values({ name });
  await recordAudit(db, {
    actorId,
    action: 'studio.renamed',
    subject: 'studio',
    details: { from: studio?.name ?? null, to: name },
  });
  return name;
}

/**
 * What every customer document needs from the database: the studio's name and its materials (for material and
 * colour names).
 * @param db - database
 */
export async function documentFacts(
  db: Queryable,
): Promise<{ studioName: string; materials: ReadonlyMap<string, Material> }> {
  const [studioName, materials] = await Promise.all([getStudioName(db), loadMaterials(db)]);
  return { studioName, materials };
}
