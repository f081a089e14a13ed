/** Default printer profiles and materials every new database starts with (admins edit them later). */
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS } from '../../shared/production/defaults';
import type { Queryable } from './client';
import { materials, printerProfiles } from './schema';
import { registerSeedStep } from './seedRegistry';

/**
 * Inserts DEFAULT_PRINTERS and DEFAULT_MATERIALS (shared/production/defaults.ts), keeping rows that already exist.
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
