/**
 * Default printer profiles, materials, print settings and cost rates every new database starts with (admins edit
 * them on the settings screen). These defaults are read nowhere else: everything else reads the database.
 */
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import type { Queryable } from './client';
import { materials, printerProfiles, productionSettings } from './schema';
import { registerSeedStep } from './seedRegistry';

/**
 * Inserts DEFAULT_PRINTERS, DEFAULT_MATERIALS and the default print settings and rates (shared/production/defaults.ts),
 * keeping rows that already exist.
 * @param db - database
 * @returns how many printers and materials were added
 */
export async function seedProduction(db: Queryable): Promise<{ printers: number; materials: number }> {
  const addedPrinters = await db
    .insert(printerProfiles)
    .values(DEFAULT_PRINTERS.map((printer) => ({ id: printer.id, name: printer.name, data: { ...printer } })))
    .onConflictDoNothing()
    .returning({ id: printerProfiles.id });
  const addedMaterials = await db
    .insert(materials)
    .values(DEFAULT_MATERIALS.map((material) => ({ id: material.id, name: material.name, data: { ...material } })))
    .onConflictDoNothing()
    .returning({ id: materials.id });
  await db
    .insert(productionSettings)
    .values({ id: 'studio', settings: DEFAULT_SETTINGS, rates: DEFAULT_RATES })
    .onConflictDoNothing();
  return { printers: addedPrinters.length, materials: addedMaterials.length };
}

registerSeedStep({
  name: 'production-defaults',
  demo: false,
  async run({ db, log }) {
    const added = await seedProduction(db);
    log(`  production defaults: ${added.printers} printers, ${added.materials} materials`);
  },
});
