import { ProductionCatalogueSchema, type ProductionCatalogue } from '../../shared/schemas/production';
import { api } from './client';

/**
 * The studio's printers and materials (from the database) with the print settings and cost rates in force.
 * @returns the catalogue, checked by {@link ProductionCatalogueSchema}
 */
export function getProductionCatalogue(): Promise<ProductionCatalogue> {
  return api('/production', { schema: ProductionCatalogueSchema });
}
