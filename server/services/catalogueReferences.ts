/**
 * What still uses a printer, a material, a colour or a finish: family revisions name a printer and a material, and
 * their variants name a material, a colour and a finish. Quotes and orders name SKUs of those variants, so a profile
 * that no variant or revision uses is used by no quote or order either. The settings screen refuses to remove
 * anything this finds, and says which families to change first.
 */
import { eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { Queryable } from '../db/client';
import { familyRevisions, familyVariants, materials, printerProfiles } from '../db/schema';
import { conflict } from '../http/HttpError';

/** The newest name of each family among revision rows, sorted. */
function familyNames(rows: { familyId: string; name: string; number: number }[]): string[] {
  const newest = new Map<string, { name: string; number: number }>();
  for (const row of rows) {
    const seen = newest.get(row.familyId);
    if (!seen || row.number > seen.number) newest.set(row.familyId, row);
  }
  return [...newest.values()].map((r) => r.name).sort((a, b) => a.localeCompare(b));
}

const revisionColumns = {
  familyId: familyRevisions.familyId,
  name: familyRevisions.name,
  number: familyRevisions.number,
};

/** Revisions whose variants match `where`, with their family names. */
async function familiesWithVariants(db: Queryable, where: SQL): Promise<string[]> {
  const rows = await db
    .select(revisionColumns)
    .from(familyVariants)
    .innerJoin(familyRevisions, eq(familyVariants.revisionId, familyRevisions.id))
    .where(where);
  return familyNames(rows);
}

/**
 * Families (any revision) that print on a printer.
 * @param db - database
 * @param printerId - the printer's identifier
 */
export async function familiesUsingPrinter(db: Queryable, printerId: string): Promise<string[]> {
  return familyNames(
    await db.select(revisionColumns).from(familyRevisions).where(eq(familyRevisions.printerId, printerId)),
  );
}

/**
 * Families (any revision) made of a material, as the revision's material or a variant's.
 * @param db - database
 * @param materialId - the material's identifier
 */
export async function familiesUsingMaterial(db: Queryable, materialId: string): Promise<string[]> {
  const [byRevision, byVariant] = await Promise.all([
    db.select(revisionColumns).from(familyRevisions).where(eq(familyRevisions.materialId, materialId)),
    db
      .select(revisionColumns)
      .from(familyVariants)
      .innerJoin(familyRevisions, eq(familyVariants.revisionId, familyRevisions.id))
      .where(sql`${familyVariants.attributes}->>'material' = ${materialId}`),
  ]);
  return familyNames([...byRevision, ...byVariant]);
}

/**
 * Families with a variant in one of these colours of a material.
 * @param db - database
 * @param materialId - the material's identifier
 * @param colourIds - identifiers of its colours
 */
export async function familiesUsingColours(
  db: Queryable,
  materialId: string,
  colourIds: readonly string[],
): Promise<string[]> {
  if (colourIds.length === 0) return [];
  return familiesWithVariants(
    db,
    sql`${familyVariants.attributes}->>'material' = ${materialId} and ${familyVariants.attributes}->>'colour' in (${sql.join(
      colourIds.map((id) => sql`${id}`),
      sql`, `,
    )})`,
  );
}

/**
 * Families with a variant in one of these finishes.
 * @param db - database
 * @param finishIds - identifiers of finishes
 */
export async function familiesUsingFinishes(db: Queryable, finishIds: readonly string[]): Promise<string[]> {
  if (finishIds.length === 0) return [];
  return familiesWithVariants(
    db,
    sql`${familyVariants.attributes}->>'finish' in (${sql.join(
      finishIds.map((id) => sql`${id}`),
      sql`, `,
    )})`,
  );
}

/**
 * Locks (FOR SHARE) the printer and the materials a family save is about to name, inside the save's transaction and
 * before it checks them. A removal locks its profile rows FOR UPDATE, so the two take turns: a removal that came
 * first has deleted the row and the save's check no longer finds it (refused in words); a save that came first
 * holds its rows until it commits, and the removal then finds the family and refuses. Rows are locked in identifier
 * order, printer first, as removals lock them, so no two transactions wait on each other in a circle.
 * @param tx - the save's transaction
 * @param printerId - the printer the family prints on
 * @param materialIds - the materials its revision and variants name
 */
export async function lockProfilesNamed(
  tx: Queryable,
  printerId: string,
  materialIds: readonly string[],
): Promise<void> {
  await tx
    .select({ id: printerProfiles.id })
    .from(printerProfiles)
    .where(eq(printerProfiles.id, printerId))
    .for('share');
  const named = [...new Set(materialIds)];
  if (named.length === 0) return;
  await tx
    .select({ id: materials.id })
    .from(materials)
    .where(inArray(materials.id, named))
    .orderBy(materials.id)
    .for('share');
}

/**
 * A list of family names for a sentence: "Wren Box", "Wren Box and Tit Box", "Wren Box, Tit Box and 3 more".
 * @param names - family names
 */
export function namesInWords(names: readonly string[]): string {
  const quoted = names.map((n) => `“${n}”`);
  if (quoted.length <= 1) return quoted.join('');
  if (quoted.length <= 3) return `${quoted.slice(0, -1).join(', ')} and ${quoted[quoted.length - 1]}`;
  return `${quoted.slice(0, 2).join(', ')} and ${quoted.length - 2} more`;
}

/**
 * Throws 409 in words when `families` is not empty.
 * @param families - names of the families that use the thing
 * @param what - what cannot be removed, e.g. `The printer “Hazel Tall 04”`
 * @param action - `removed` or similar
 */
export function refuseWhileUsed(families: readonly string[], what: string, action = 'removed'): void {
  if (families.length === 0) return;
  const count = families.length === 1 ? 'the family' : `${families.length} families`;
  throw conflict(
    'in_use',
    `${what} cannot be ${action} while ${count} ${namesInWords(families)} ${families.length === 1 ? 'uses' : 'use'} it. Change ${families.length === 1 ? 'that family' : 'those families'} first, or keep it.`,
  );
}
