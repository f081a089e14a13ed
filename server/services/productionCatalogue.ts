/** The production catalogue the design editor reads: printers and materials from the database, settings and rates. */
import { DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import { ProductionCatalogueSchema, type ProductionCatalogue } from '../../shared/schemas/production';
import type { Queryable } from '../db/client';
import { loadMaterials, loadPrinters } from './familyProduction';

/**
 * Every printer profile (sorted by name) and material (cheapest first, so a picker's first entry is the everyday
 * one), rows checked by the shared schemas, with the default print settings and cost rates: the database has no
 * table for those yet, so the defaults of shared/production apply.
 * @param db - database
 * @returns the catalogue, parsed with {@link ProductionCatalogueSchema}
 */
export async function loadProductionCatalogue(db: Queryable): Promise<ProductionCatalogue> {
  const byName = (a: { name: string }, b: { name: string }) => a.name.localeCompare(b.name);
  const [printers, materials] = await Promise.all([loadPrinters(db), loadMaterials(db)]);
  return ProductionCatalogueSchema.parse({
    printers: [...printers.values()].sort(byName),
    materials: [...materials.values()].sort((a, b) => a.priceCentsPerKg - b.priceCentsPerKg || byName(a, b)),
    settings: DEFAULT_SETTINGS,
    rates: DEFAULT_RATES,
  });
}
