/**
 * The studio's name and locale: kept in the `studios` table. The app's header, documents and mails show the name;
 * screens and documents write money (and dates) in the locale.
 */
import { asc, eq } from 'drizzle-orm';
import type { Queryable } from '../db/client';
import { studios } from '../db/schema';
import type { Material } from '../../shared/schemas/production';
import type { StudioFacts } from '../../shared/schemas/studioFacts';
import { DEFAULT_LOCALE } from '../../shared/format/locale';
import { recordAudit } from './audit';
import { loadMaterials } from './familyProduction';

/** The name used until a studio exists (a database that was migrated but never seeded). */
export const FALLBACK_STUDIO_NAME = 'Fernhollow Studio';

/**
 * The studio's name and locale: the first studio's (a database holds one studio), or the fallbacks when there is
 * none yet.
 * @param db - database
 */
export async function getStudio(db: Queryable): Promise<StudioFacts> {
  const [studio] = await db
    .select({ name: studios.name, locale: studios.locale })
    .from(studios)
    .orderBy(asc(studios.createdAt))
    .limit(1);
  return { name: studio?.name ?? FALLBACK_STUDIO_NAME, locale: studio?.locale ?? DEFAULT_LOCALE };
}

/**
 * The studio's name (see {@link getStudio}).
 * @param db - database
 */
export async function getStudioName(db: Queryable): Promise<string> {
  return (await getStudio(db)).name;
}

/**
 * The studio's locale (see {@link getStudio}).
 * @param db - database
 */
export async function getStudioLocale(db: Queryable): Promise<string> {
  return (await getStudio(db)).locale;
}

/**
 * Renames the studio and, when given, changes its locale (creating the studio when the database has none); records
 * who did it.
 * @param db - database
 * @param change - the new name, and the new locale or undefined to keep it (both validated by the route)
 * @param actorId - who changed it
 * @returns the saved name and locale
 */
export async function saveStudio(
  db: Queryable,
  change: { name: string; locale?: string },
  actorId: string,
): Promise<StudioFacts> {
  const [studio] = await db.select().from(studios).orderBy(asc(studios.createdAt)).limit(1);
  const saved: StudioFacts = { name: change.name, locale: change.locale ?? studio?.locale ?? DEFAULT_LOCALE };
  if (studio)
    await db
      .update(studios)
      .set({ ...saved, updatedAt: new Date() })
      .where(eq(studios.id, studio.id));
  else await db.insert(studios).values(saved);
  if (studio?.name !== saved.name)
    await recordAudit(db, {
      actorId,
      action: 'studio.renamed',
      subject: 'studio',
      details: { from: studio?.name ?? null, to: saved.name },
    });
  if (studio && studio.locale !== saved.locale)
    await recordAudit(db, {
      actorId,
      action: 'studio.locale_changed',
      subject: 'studio',
      details: { from: studio.locale, to: saved.locale },
    });
  return saved;
}

/**
 * What every customer document needs from the database: the studio's name, the locale its figures are written in,
 * and its materials (for material and colour names).
 * @param db - database
 */
export async function documentFacts(
  db: Queryable,
): Promise<{ studioName: string; locale: string; materials: ReadonlyMap<string, Material> }> {
  const [studio, materials] = await Promise.all([getStudio(db), loadMaterials(db)]);
  return { studioName: studio.name, locale: studio.locale, materials };
}
