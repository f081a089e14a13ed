/**
 * The catalogue: published variants with everything a spec sheet, price list or quote needs.
 *
 * Route: `GET /api/catalogue?q=&familyId=&colour=&material=` (sales, catalogue_manager, designer)
 * -> {@link CatalogueResponse}.
 */
import { z } from 'zod';
import { AcknowledgementSchema } from './gate';
import { PhotoSchema } from './photo';
import { VariantCostSchema, VariantReportSchema, VariantSchema } from './variant';

/** A published variant with everything a spec sheet, price list or quote needs (bird-facing facts in `report.facts`). */
export const CatalogueVariantSchema = VariantSchema.pick({
  sku: true,
  variantKey: true,
  axisValues: true,
  params: true,
  attributes: true,
  sha256: true,
  verdict: true,
  birdFitWarnings: true,
}).extend({
  family: z.object({ id: z.string(), code: z.string(), name: z.string(), description: z.string() }),
  revision: z.number().int(),
  templateId: z.string(),
  templateVersion: z.number().int(),
  report: VariantReportSchema,
  cost: VariantCostSchema,
  /** Suggested unit price in cents (the cost's suggested price). */
  priceCents: z.number().int(),
  currency: z.string(),
  acknowledgements: z.array(AcknowledgementSchema),
  photos: z.array(PhotoSchema),
  publishedAt: z.string(),
});
/** A published variant (see {@link CatalogueVariantSchema}). */
export type CatalogueVariant = z.infer<typeof CatalogueVariantSchema>;

/** Query of `GET /api/catalogue`. */
export const CatalogueQuerySchema = z.object({
  /** Substring of SKU or family name (case-insensitive). */
  q: z.string().max(80).optional(),
  familyId: z.string().optional(),
  colour: z.string().optional(),
  material: z.string().optional(),
});
/** Query of `GET /api/catalogue`. */
export type CatalogueQuery = z.infer<typeof CatalogueQuerySchema>;

/** Answer of `GET /api/catalogue`. */
export const CatalogueResponseSchema = z.object({ variants: z.array(CatalogueVariantSchema) });
/** Answer of `GET /api/catalogue`. */
export type CatalogueResponse = z.infer<typeof CatalogueResponseSchema>;
