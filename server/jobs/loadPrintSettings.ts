import type { CostRates, PrintSettings } from '../../shared/schemas/production';
import { PrintRecipeSchema, type PrintRecipe } from '../../shared/schemas/wallRecipe';
import type { Queryable } from '../db/client';
import { loadProductionCatalogue } from '../services/productionCatalogue';

/**
 * The studio's print settings with a family's own perimeters and infill laid over them, and the studio's cost rates:
 * what every variant of the family is estimated with.
 * @param db - database
 * @param recipe - the family's print recipe (null fields keep the studio's settings)
 */
export async function loadPrintSettings(
  db: Queryable,
  recipe: PrintRecipe | null | undefined,
): Promise<{ settings: PrintSettings; rates: CostRates }> {
  const catalogue = await loadProductionCatalogue(db);
  // Read through the schema: a recipe stored under the old key (`wallLoops`) keeps its value.
  const r = recipe ? PrintRecipeSchema.parse(recipe) : null;
  return {
    settings: {
      ...catalogue.settings,
      ...(r?.perimeters != null ? { perimeters: r.perimeters } : {}),
      ...(r?.infillPct != null ? { infillPct: r.infillPct } : {}),
    },
    rates: catalogue.rates,
  };
}
