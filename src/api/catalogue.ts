import { CatalogueResponseSchema, type CatalogueQuery, type CatalogueVariant } from '../../shared/schemas/catalogue';
import { api } from './client';

/**
 * Published variants, optionally searched by SKU or family name and filtered by family, colour or material.
 * @param query - search text and filters
 */
export async function listCatalogue(query: CatalogueQuery = {}): Promise<CatalogueVariant[]> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value) params.set(key, value);
  const text = params.toString();
  return (await api(`/catalogue${text ? `?${text}` : ''}`, { schema: CatalogueResponseSchema })).variants;
}
