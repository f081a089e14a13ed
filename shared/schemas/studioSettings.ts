/** What the admin settings screen edits besides the sales settings: the studio's name, print settings and rates. */
import { z } from 'zod';
import { CostRatesSchema, PrintSettingsSchema } from './production';

/** The studio's name as documents, mails and the app's header show it. */
export const StudioNameSchema = z.object({
  name: z.string().trim().min(1, 'Give the studio a name.').max(80, 'Keep the studio name to 80 characters or fewer.'),
});
/** A studio-name update (see {@link StudioNameSchema}). */
export type StudioName = z.infer<typeof StudioNameSchema>;

/** The studio's print settings and cost rates, saved together. */
export const ProductionSettingsSchema = z.object({ settings: PrintSettingsSchema, rates: CostRatesSchema });
/** Print settings and cost rates (see {@link ProductionSettingsSchema}). */
export type ProductionSettings = z.infer<typeof ProductionSettingsSchema>;

/** Print settings and rates with when they were last saved (null while the built-in defaults apply). */
export const StoredProductionSettingsSchema = ProductionSettingsSchema.extend({ updatedAt: z.string().nullable() });
/** See {@link StoredProductionSettingsSchema}. */
export type StoredProductionSettings = z.infer<typeof StoredProductionSettingsSchema>;

/** Ids of printers, materials and colours: lower case words joined by hyphens, as the seed data uses. */
export const CatalogueIdSchema = z
  .string()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens for the identifier, e.g. pla-outdoor.')
  .max(60, 'Keep the identifier to 60 characters or fewer.');
