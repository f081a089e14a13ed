import { z } from 'zod';

/** Largest thumbnail the API stores, as a data URL string (about 66 KB of PNG; JSON bodies stay under the 100 KB body limit). */
export const PRESET_THUMBNAIL_MAX_CHARS = 90_000;

/** Prefix every stored thumbnail must carry: a base64 PNG data URL. */
export const PRESET_THUMBNAIL_PREFIX = 'data:image/png;base64,';

/** A PNG data URL rendered from the viewer canvas on save, limited in size. */
export const PresetThumbnailSchema = z
  .string()
  .max(PRESET_THUMBNAIL_MAX_CHARS, 'The preview picture is too large.')
  .refine((value) => value.startsWith(PRESET_THUMBNAIL_PREFIX), {
    message: 'The preview picture must be a PNG image.',
  })
  .refine((value) => /^[A-Za-z0-9+/]+={0,2}$/.test(value.slice(PRESET_THUMBNAIL_PREFIX.length)), {
    message: 'The preview picture could not be read.',
  });

/** A preset's display name: trimmed, 1 to 80 characters. */
export const PresetNameSchema = z
  .string()
  .trim()
  .min(1, 'Give the preset a name.')
  .max(80, 'A preset name can be at most 80 characters long.');

/**
 * A designer's named parameter set for one template. `params` holds millimetres (and booleans / choices) exactly as
 * the template's parameter schema reads them; the server validates them with the template's parseParams.
 */
export const PresetSchema = z.object({
  id: z.string(),
  ownerId: z.string(),
  templateId: z.string().trim().min(1).max(64),
  /** Template version the parameters were saved against. */
  templateVersion: z.number().int().nonnegative(),
  name: PresetNameSchema,
  params: z.record(z.string(), z.unknown()),
  thumbnail: PresetThumbnailSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
/** A designer's named parameter set for one template. */
export type Preset = z.infer<typeof PresetSchema>;

/** Body of `POST /api/presets`. */
export const PresetCreateSchema = PresetSchema.pick({ templateId: true, name: true, params: true }).extend({
  thumbnail: PresetThumbnailSchema.optional(),
});
/** Body of `POST /api/presets`. */
export type PresetCreate = z.infer<typeof PresetCreateSchema>;

/** Body of `PATCH /api/presets/:id`: rename, new parameters and/or a new thumbnail. */
export const PresetUpdateSchema = PresetSchema.pick({ name: true, params: true })
  .extend({ thumbnail: PresetThumbnailSchema.nullable() })
  .partial()
  .refine((body) => Object.keys(body).length > 0, {
    message: 'Nothing to save: change the name, the parameters or the picture first.',
  });
/** Body of `PATCH /api/presets/:id`. */
export type PresetUpdate = z.infer<typeof PresetUpdateSchema>;

/** Query of `GET /api/presets`. */
export const PresetListQuerySchema = z.object({ templateId: z.string().trim().min(1).max(64).optional() });
/** Query of `GET /api/presets`. */
export type PresetListQuery = z.infer<typeof PresetListQuerySchema>;

/** Path parameters of `/api/presets/:id`. */
export const PresetIdParamsSchema = z.object({ id: z.string().min(1).max(64) });

/** Answer of `GET /api/presets`. */
export const PresetListSchema = z.object({ presets: z.array(PresetSchema) });
/** Answer of `GET /api/presets`. */
export type PresetList = z.infer<typeof PresetListSchema>;
