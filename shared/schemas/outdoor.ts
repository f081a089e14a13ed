import { z } from 'zod';
import { MaterialSchema } from './production';

/** A printed wall: solid perimeters on both faces and a sparse infill core between them. */
export const WallResistanceInputSchema = z.object({
  wallThicknessMm: z.number().positive(),
  /** Perimeters on each face of the wall. */
  perimeters: z.number().int().min(1),
  lineWidthMm: z.number().positive(),
  /** Infill density of the core, 0–100. */
  infillPct: z.number().min(0).max(100),
  /** Conductivity of the solid printed polymer (PLA ≈ 0.13). */
  polymerK: z.number().positive(),
});
/** Wall resistance input (see {@link WallResistanceInputSchema}). */
export type WallResistanceInput = z.infer<typeof WallResistanceInputSchema>;

/** Conductive thermal resistance of a printed wall, with bounds, a pine-board comparison and the model's limits. */
export const WallResistanceSchema = z.object({
  skinThicknessMm: z.number(),
  coreThicknessMm: z.number(),
  /** Estimated infill cell size (line spacing) in the core; larger cells let air move. */
  infillCellSizeMm: z.number().nullable(),
  /** Parallel-path estimate (webs as continuous heat paths): the lower, cautious value. */
  rM2KW: z.number(),
  /** Series estimate (air and polymer in layers): an upper bound. */
  rUpperM2KW: z.number(),
  /** A 19 mm (¾ in) pine board, k = 0.11 W/m·K. */
  pineBoardRM2KW: z.number(),
  /** rM2KW as a share of the pine board. */
  ratioToPine: z.number(),
  limits: z.array(z.string()),
});
/** Wall resistance result (see {@link WallResistanceSchema}). */
export type WallResistance = z.infer<typeof WallResistanceSchema>;

/** Inputs of the sol-air temperature T_sa = T_o + α·I/h_o − ε·ΔR/h_o. */
export const SolAirInputSchema = z.object({
  airC: z.number(),
  irradianceWm2: z.number().nonnegative(),
  absorptance: z.number().min(0).max(1),
  /** Outside combined film coefficient (ASHRAE 17 W/m²K). */
  hoC: z.number().positive(),
  /** The ε·ΔR/h_o term in kelvin: about 3.9 K for a roof facing the sky, 0 for a wall. */
  longwaveCorrectionK: z.number(),
});
/** Sol-air input (see {@link SolAirInputSchema}). */
export type SolAirInput = z.infer<typeof SolAirInputSchema>;

/** ok: well below the heat-deflection temperature; caution: within the margin; fail: at or above it. */
export const OutdoorVerdictSchema = z.enum(['ok', 'caution', 'fail']);
/** Outdoor verdict (see {@link OutdoorVerdictSchema}). */
export type OutdoorVerdict = z.infer<typeof OutdoorVerdictSchema>;

/** One sunlit surface against the material's heat-deflection temperature. */
export const SurfaceHeatSchema = z.object({
  irradianceWm2: z.number(),
  solAirC: z.number(),
  /** Heat-deflection temperature minus sol-air temperature; negative means it is exceeded. */
  marginK: z.number(),
  verdict: OutdoorVerdictSchema,
});
/** Surface heat result (see {@link SurfaceHeatSchema}). */
export type SurfaceHeat = z.infer<typeof SurfaceHeatSchema>;

/** Outdoor fitness of a box in one material and colour. */
export const OutdoorAssessmentSchema = z.object({
  materialId: z.string(),
  colourId: z.string(),
  absorptance: z.number(),
  heatDeflectionC: z.number(),
  airC: z.number(),
  roof: SurfaceHeatSchema,
  wall: SurfaceHeatSchema,
  verdict: OutdoorVerdictSchema,
  wallResistance: WallResistanceSchema.optional(),
  cautions: z.array(z.string()),
});
/** Outdoor assessment (see {@link OutdoorAssessmentSchema}). */
export type OutdoorAssessment = z.infer<typeof OutdoorAssessmentSchema>;

/**
 * Options of the outdoor assessment. Defaults are the ASHRAE Handbook—Fundamentals sol-air design case: air 30 °C, roof 1000 W/m²,
 * wall 600 W/m², h_o 17 W/m²K, roof long-wave correction 3.9 K.
 */
export const AssessOutdoorOptionsSchema = z.object({
  material: MaterialSchema,
  /** One of the material's colour ids. */
  colourId: z.string().min(1),
  airC: z.number().default(30),
  roofIrradianceWm2: z.number().nonnegative().default(1000),
  wallIrradianceWm2: z.number().nonnegative().default(600),
  hoWm2K: z.number().positive().default(17),
  roofLongwaveCorrectionK: z.number().default(3.9),
  /** A surface within this many kelvin of the heat-deflection temperature gets "caution". */
  cautionMarginK: z.number().nonnegative().default(10),
  /** The printed wall, for its thermal resistance beside a pine board. */
  wall: WallResistanceInputSchema.omit({ polymerK: true }).optional(),
});
/** Outdoor assessment input as callers write it (defaults optional). */
export type AssessOutdoorOptions = z.input<typeof AssessOutdoorOptionsSchema>;
