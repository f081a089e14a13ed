/**
 * The production catalogue: printers, materials (with their colours), print settings and cost rates, all from the
 * database. The built-in defaults of shared/production only seed it (server/db/seedProduction.ts); until a studio
 * saves its own print settings and rates, the seeded defaults stand in for the missing row.
 */
import { eq } from 'drizzle-orm';
import { DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import {
  ProductionCatalogueSchema,
  type Material,
  type PrinterProfile,
  type ProductionCatalogue,
} from '../../shared/schemas/production';
import type { ProductionSettings, StoredProductionSettings } from '../../shared/schemas/studioSettings';
import type { Db, Queryable } from '../db/client';
import { materials, printerProfiles, productionSettings } from '../db/schema';
import { conflict, notFound } from '../http/HttpError';
import { recordAudit } from './audit';
import {
  familiesUsingColours,
  familiesUsingMaterial,
  familiesUsingPrinter,
  refuseWhileUsed,
} from './catalogueReferences';
import { catalogueChanged } from './catalogueCache';
import { loadMaterials, loadPrinters } from './familyProduction';

const ROW_ID = 'studio';

/**
 * The studio's print settings and cost rates, or the built-in defaults while none are saved.
 * @param db - database
 */
export async function loadProductionSettings(db: Queryable): Promise<StoredProductionSettings> {
  const [row] = await db.select().from(productionSettings).where(eq(productionSettings.id, ROW_ID));
  if (!row) return { settings: DEFAULT_SETTINGS, rates: DEFAULT_RATES, updatedAt: null };
  return { settings: row.settings, rates: row.rates, updatedAt: row.updatedAt.toISOString() };
}

/**
 * Saves the print settings and cost rates (validated by the route).
 * @param db - database
 * @param input - settings and rates
 * @param actorId - who saved them (null for seeding)
 */
export async function saveProductionSettings(
  db: Queryable,
  input: ProductionSettings,
  actorId: string | null,
): Promise<StoredProductionSettings> {
  const now = new Date();
  const values = { settings: input.settings, rates: input.rates, updatedById: actorId, updatedAt: now };
  const [row] = await db
    .insert(productionSettings)
    .values({ id: ROW_ID, ...values })
    .onConflictDoUpdate({ target: productionSettings.id, set: values })
    .returning();
  if (actorId) await recordAudit(db, { actorId, action: 'production.settings_saved', subject: 'production:settings' });
  return { settings: row.settings, rates: row.rates, updatedAt: row.updatedAt.toISOString() };
}

/**
 * Every printer profile (sorted by name) and material (cheapest first, so a picker's first entry is the everyday
 * one), rows checked by the shared schemas, with the studio's print settings and cost rates.
 * @param db - database
 * @returns the catalogue, parsed with {@link ProductionCatalogueSchema}
 */
export async function loadProductionCatalogue(db: Queryable): Promise<ProductionCatalogue> {
  const byName = (a: { name: string }, b: { name: string }) => a.name.localeCompare(b.name);
  const [printers, materialsById, stored] = await Promise.all([
    loadPrinters(db),
    loadMaterials(db),
    loadProductionSettings(db),
  ]);
  return ProductionCatalogueSchema.parse({
    printers: [...printers.values()].sort(byName),
    materials: [...materialsById.values()].sort((a, b) => a.priceCentsPerKg - b.priceCentsPerKg || byName(a, b)),
    settings: stored.settings,
    rates: stored.rates,
  });
}

/** The printers' or the materials' table, its kind in words and who uses one (saves and removals). */
interface ProfileTable {
  table: typeof printerProfiles | typeof materials;
  /** `printer` or `material`: the word in answers, the audit action and subject, the 409 code `last_<kind>`. */
  kind: 'printer' | 'material';
  /** The families that use one profile (any revision or variant). */
  familiesUsing: (db: Queryable, id: string) => Promise<string[]>;
}

/**
 * Writes a printer profile or a material (insert or replace) and records it in the audit.
 * @param db - database or transaction
 * @param on - the table and the kind of profile
 * @param profile - the profile, kept whole as its row's data
 * @param existed - whether it was saved before (audit `<kind>.changed`, else `<kind>.added`)
 * @param actorId - who saved it
 */
async function writeProfile(
  db: Queryable,
  on: Pick<ProfileTable, 'table' | 'kind'>,
  profile: PrinterProfile | Material,
  existed: boolean,
  actorId: string,
): Promise<void> {
  const { table, kind } = on;
  const row = { name: profile.name, data: { ...profile } };
  await db
    .insert(table)
    .values({ id: profile.id, ...row })
    .onConflictDoUpdate({ target: table.id, set: { ...row, updatedAt: new Date() } });
  await recordAudit(db, {
    actorId,
    action: `${kind}.${existed ? 'changed' : 'added'}`,
    subject: `${kind}:${profile.id}`,
  });
}

/**
 * Adds or replaces one printer profile.
 * @param db - database
 * @param printer - the profile (validated by the route)
 * @param actorId - who saved it
 * @returns whether the printer is new
 */
export async function savePrinter(db: Db, printer: PrinterProfile, actorId: string): Promise<{ created: boolean }> {
  const [existing] = await db
    .select({ id: printerProfiles.id })
    .from(printerProfiles)
    .where(eq(printerProfiles.id, printer.id));
  await writeProfile(db, { table: printerProfiles, kind: 'printer' }, printer, Boolean(existing), actorId);
  return { created: !existing };
}

/**
 * Adds or replaces one material with its colours, refusing in words to take out a colour a family's variants use.
 * The material's row is locked (FOR UPDATE) while its colours are checked and saved, so a family save naming the
 * material (which locks it FOR SHARE, see `lockProfilesNamed`) either comes first and is found here, or comes after
 * and finds the colour gone.
 * @param db - database
 * @param material - the material (validated by the route)
 * @param actorId - who saved it
 * @returns whether the material is new
 * @throws HttpError 409 `in_use` naming the families that use a colour taken out
 */
export async function saveMaterial(db: Db, material: Material, actorId: string): Promise<{ created: boolean }> {
  const created = await db.transaction(async (tx) => {
    const [existing] = await tx
      .select({ data: materials.data })
      .from(materials)
      .where(eq(materials.id, material.id))
      .for('update');
    const kept = new Set(material.colours.map((c) => c.id));
    const before = (existing?.data.colours as { id: string; name: string }[] | undefined) ?? [];
    for (const colour of before.filter((c) => !kept.has(c.id)))
      refuseWhileUsed(
        await familiesUsingColours(tx, material.id, [colour.id]),
        `The colour “${colour.name}” of ${material.name}`,
        'taken out',
      );
    await writeProfile(tx, { table: materials, kind: 'material' }, material, Boolean(existing), actorId);
    return !existing;
  });
  // Material and colour names show in the shop and on documents.
  catalogueChanged(db);
  return { created };
}

/**
 * Removes a printer or a material in one transaction: it locks every profile row of its table first (so two
 * removals, and a family save naming the profile, take turns: see `lockProfilesNamed`), then checks that the
 * profile exists, that no family uses it and that it is not the studio's last one, deletes it and records the audit.
 */
async function removeProfile(db: Db, on: ProfileTable, id: string, actorId: string): Promise<void> {
  const { table, kind } = on;
  await db.transaction(async (tx) => {
    // Rows are locked in one order, so two removals never wait on each other in a circle; a row another
    // transaction deleted meanwhile is not returned.
    const rows = await tx.select({ id: table.id, name: table.name }).from(table).orderBy(table.id).for('update');
    const profile = rows.find((row) => row.id === id);
    if (!profile) throw notFound(`There is no such ${kind}: it may have been removed already.`);
    refuseWhileUsed(await on.familiesUsing(tx, id), `The ${kind} “${profile.name}”`);
    if (rows.length === 1)
      throw conflict(`last_${kind}`, `“${profile.name}” is the studio’s only ${kind}: add another before removing it.`);
    await tx.delete(table).where(eq(table.id, id));
    await recordAudit(tx, { actorId, action: `${kind}.removed`, subject: `${kind}:${id}` });
  });
}

/**
 * Removes a printer profile, refused in words while a family prints on it or when it is the studio's only one.
 * @param db - database
 * @param id - the printer's identifier
 * @param actorId - who removed it
 * @throws HttpError 404 when there is no such printer, 409 `in_use` naming the families, 409 `last_printer`
 */
export async function removePrinter(db: Db, id: string, actorId: string): Promise<void> {
  await removeProfile(
    db,
    { table: printerProfiles, kind: 'printer', familiesUsing: familiesUsingPrinter },
    id,
    actorId,
  );
}

/**
 * Removes a material with its colours, refused in words while a family uses it or when it is the studio's only one.
 * @param db - database
 * @param id - the material's identifier
 * @param actorId - who removed it
 * @throws HttpError 404 when there is no such material, 409 `in_use` naming the families, 409 `last_material`
 */
export async function removeMaterial(db: Db, id: string, actorId: string): Promise<void> {
  await removeProfile(db, { table: materials, kind: 'material', familiesUsing: familiesUsingMaterial }, id, actorId);
  // Material and colour names show in the shop and on documents.
  catalogueChanged(db);
}
