/** What the admin settings screen edits besides the sales settings: the studio's name, print settings and rates. */
import { z } from 'zod';
import { CostRatesSchema, PrintSettingsSchema } from './production';
import { isSupportedLocale } from '../format/locale';

/** The studio's name as documents, mails and the app's header show it. */
export const StudioNameSchema = z.object({
  name: z.string().trim().min(1, 'Give the studio a name.').max(80, 'Keep the studio name to 80 characters or fewer.'),
});
/** A studio-name update (see {@link StudioNameSchema}). */
export type StudioName = z.infer<typeof StudioNameSchema>;

/** A locale figures are written in: a BCP 47 tag the runtime knows, such as `en-GB` or `de-DE`. */
export const LocaleSchema = z
  .string()
  .trim()
  .min(2, 'Choose the language and region amounts and dates are written in.')
  .max(35, 'Choose the language and region amounts and dates are written in.')
  .refine(isSupportedLocale, 'This language and region is not known here: choose one from the list.');

/** The locales the settings screen offers (any other tag the runtime knows is accepted too). */
export const OFFERED_LOCALES: readonly { tag: string; label: string }[] = [
  { tag: 'en-GB', label: 'English (United Kingdom)' },
  { tag: 'en-US', label: 'English (United States)' },
  { tag: 'en-IE', label: 'English (Ireland)' },
  { tag: 'de-DE', label: 'German (Germany)' },
  { tag: 'fr-FR', label: 'French (France)' },
  { tag: 'nl-NL', label: 'Dutch (Netherlands)' },
  { tag: 'es-ES', label: 'Spanish (Spain)' },
  { tag: 'sv-SE', label: 'Swedish (Sweden)' },
];

/** The studio as the settings screen edits it: its name and, when given, its locale (left out: kept). */
export const StudioSchema = StudioNameSchema.extend({ locale: LocaleSchema.optional() });
/** A studio update (see {@link StudioSchema}). */
export type StudioUpdate = z.infer<typeof StudioSchema>;

/** The studio's print settings and cost rates as stored. */
const ProductionSettingsShape = z.object({ settings: PrintSettingsSchema, rates: CostRatesSchema });

/** The studio's print settings and cost rates, saved together (each finish with its own identifier). */
export const ProductionSettingsSchema = ProductionSettingsShape.superRefine((value, ctx) => {
  const ids = value.rates.finishes.map((f) => f.id);
  const repeated = ids.findIndex((id, i) => ids.indexOf(id) !== i);
  if (repeated >= 0)
    ctx.addIssue({
      code: 'custom',
      path: ['rates', 'finishes', repeated, 'id'],
      message: `Two finishes share the identifier “${ids[repeated]}”: give each finish its own.`,
    });
});
/** Print settings and cost rates (see {@link ProductionSettingsSchema}). */
export type ProductionSettings = z.infer<typeof ProductionSettingsSchema>;

/** Print settings and rates with when they were last saved (null while the built-in defaults apply). */
export const StoredProductionSettingsSchema = ProductionSettingsShape.extend({ updatedAt: z.string().nullable() });
/** See {@link StoredProductionSettingsSchema}. */
export type StoredProductionSettings = z.infer<typeof StoredProductionSettingsSchema>;

/** Ids of printers, materials and colours: lower case words joined by hyphens, as the seed data uses. */
export const CatalogueIdSchema = z
  .string()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Use lower-case letters, digits and hyphens for the identifier, e.g. pla-outdoor.')
  .max(60, 'Keep the identifier to 60 characters or fewer.');
