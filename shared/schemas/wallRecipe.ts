/**
 * Wall recipes and production targets: how a wall is printed (thickness, perimeters, infill), how well it must
 * insulate, and the limits a family sets on unit cost, print hours and mass.
 */
import { z } from 'zod';
import {
  CostRatesSchema,
  MaterialSchema,
  PrinterProfileSchema,
  PrintSettingsSchema,
  ProductionInputSchema,
} from './production';

/** How one wall is printed: its thickness (a template parameter) and the perimeters and infill that fill it. */
export const WallRecipeSchema = z.object({
  wallThicknessMm: z.number().positive().max(100),
  /** Perimeters on each face of the wall. */
  perimeters: z.number().int().min(1).max(20),
  /** Infill density of the wall's core, 0–100. */
  infillPct: z.number().min(0).max(100),
});
/** A wall recipe (see {@link WallRecipeSchema}). */
export type WallRecipe = z.infer<typeof WallRecipeSchema>;

/**
 * A family's own perimeters and infill for every variant; null keeps the studio's print settings. The wall-recipe
 * optimizer writes these together with the wall thickness parameter.
 */
export const PrintRecipeSchema = z.preprocess(
  renamedPerimeters,
  z.object({
    perimeters: z
      .number()
      .int()
      .min(1, 'Use at least 1 perimeter.')
      .max(20, 'Use at most 20 perimeters.')
      .nullable()
      .default(null),
    infillPct: z.number().min(0, 'infill must be 0–100 %').max(100, 'infill must be 0–100 %').nullable().default(null),
  }),
);

/**
 * Reads a recipe saved before perimeters had their own name (`wallLoops`): the old key is taken as `perimeters`
 * when the new one is absent, so saved families and requests from an older page keep their value.
 * @param value - a recipe as sent or stored
 */
export function renamedPerimeters(value: unknown): unknown {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return value;
  const record = value as Record<string, unknown>;
  if (!('wallLoops' in record)) return value;
  const { wallLoops, ...rest } = record;
  return 'perimeters' in rest ? rest : { ...rest, perimeters: wallLoops };
}
/** A family's print recipe (see {@link PrintRecipeSchema}). */
export type PrintRecipe = z.infer<typeof PrintRecipeSchema>;

/**
 * How well a wall must insulate: at least as well as a pine board of a given thickness ("at least as good as 19 mm
 * pine"), or at least a conductive thermal resistance R in m²K/W. Both compare conduction only, without air films.
 */
export const InsulationTargetSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('pine-board'),
    /** Thickness of the pine board the wall must match, mm. */
    boardMm: z.number().min(5, 'board must be at least 5 mm').max(60, 'board must be at most 60 mm'),
  }),
  z.object({
    kind: z.literal('r-value'),
    rM2KW: z.number().positive('R must be above 0').max(5, 'R must be at most 5 m²K/W'),
  }),
]);
/** An insulation target (see {@link InsulationTargetSchema}). */
export type InsulationTarget = z.infer<typeof InsulationTargetSchema>;

/** The production targets of a family: every variant must stay within each target that is set (null: none). */
export const ProductionTargetsSchema = z.object({
  /** Highest unit cost, in the studio currency's cents. */
  maxUnitCostCents: z.number().int().positive().nullable().default(null),
  /** Longest print time of one unit, hours. */
  maxPrintHours: z.number().positive().max(1000).nullable().default(null),
  /** Heaviest unit, grams of plastic. */
  maxMassG: z.number().positive().max(100_000).nullable().default(null),
  /** Least wall insulation. */
  minInsulation: InsulationTargetSchema.nullable().default(null),
});
/** Production targets (see {@link ProductionTargetsSchema}). */
export type ProductionTargets = z.infer<typeof ProductionTargetsSchema>;

/** The four targets by name. */
export const TargetKeySchema = z.enum(['unit-cost', 'print-hours', 'mass', 'insulation']);
/** A target name (see {@link TargetKeySchema}). */
export type TargetKey = z.infer<typeof TargetKeySchema>;

/** The parameter that moves a figure most, from finite differences over the variant's numeric parameters. */
export const TargetDriverSchema = z.object({
  /** Template parameter key, or `perimeters` / `infillPct` of the print recipe. */
  key: z.string(),
  label: z.string(),
  /** Step the parameter was moved by, in its own unit. */
  step: z.number(),
  unit: z.string(),
  /** Change of the figure for one step up, in the figure's unit (negative: the figure falls). */
  effectPerStep: z.number(),
});
/** A target driver (see {@link TargetDriverSchema}). */
export type TargetDriver = z.infer<typeof TargetDriverSchema>;

/** One target checked against one design or variant. */
export const TargetCheckSchema = z.object({
  key: TargetKeySchema,
  label: z.string(),
  /** The figure in the target's unit: cents, hours, grams or m²K/W. */
  value: z.number(),
  limit: z.number(),
  /** True when the figure is within the target. */
  met: z.boolean(),
  /** How far past the target, in its unit (0 when met). */
  overBy: z.number().nonnegative(),
  /** How far past the target as a share of the target, % (0 when met). */
  overByPct: z.number().nonnegative(),
  /** The parameter that moves the figure most (absent when not worked out). */
  driver: TargetDriverSchema.nullable().default(null),
  /**
   * Why an insulation figure does not count although it reaches the limit: the infill's air cells are large enough
   * for air to move, which the conduction model leaves out (null otherwise).
   */
  note: z.string().nullable().default(null),
});
/** A target check (see {@link TargetCheckSchema}). */
export type TargetCheck = z.infer<typeof TargetCheckSchema>;

/** The figures of a design that targets are checked against. */
export const TargetFiguresSchema = z.object({
  unitCostCents: z.number(),
  printTimeMin: z.number(),
  massG: z.number(),
  /** Conductive R of the side wall, m²K/W (null when unknown). */
  wallRM2KW: z.number().nullable(),
  /**
   * Estimated air-cell size of the wall's infill core, mm (null: no core, the wall is all perimeters, or unknown;
   * Infinity: a core with no infill, an open gap).
   */
  wallCellMm: z.number().nullable().optional(),
  /** Least infill that keeps the core's air cells within the convection limit, % (null when unknown). */
  wallCellInfillPct: z.number().nullable().optional(),
});
/** Target figures (see {@link TargetFiguresSchema}). */
export type TargetFigures = z.infer<typeof TargetFiguresSchema>;

/** The part measured at one wall thickness: what the production estimate needs. */
export const WallSampleSchema = z.object({
  wallThicknessMm: z.number().positive(),
  input: ProductionInputSchema,
});
/** A wall sample (see {@link WallSampleSchema}). */
export type WallSample = z.infer<typeof WallSampleSchema>;

/** What the wall-recipe optimizer searches and against what. */
export const WallOptimizeOptionsSchema = z.object({
  /** The design measured at two or more wall thicknesses across the range (one sample fixes the thickness). */
  samples: z.array(WallSampleSchema).min(1),
  /** Wall thickness range to search (the template's live limits) and its step. */
  wallRangeMm: z.object({ min: z.number().positive(), max: z.number().positive(), step: z.number().positive() }),
  target: InsulationTargetSchema,
  /**
   * Printers to price the recipes on (one or more): each has its own line width, hence its own air-cell size and
   * speed, so comparing nozzles turns cost against print time into a real trade-off.
   */
  printers: z.array(PrinterProfileSchema).min(1, 'choose at least one printer'),
  material: MaterialSchema,
  settings: PrintSettingsSchema,
  rates: CostRatesSchema,
  finishId: z.string().nullable().default(null),
  /** Fewest and most perimeters per face; two is the usual minimum for a sound outer skin. */
  minPerimeters: z.number().int().min(1).max(20).default(2),
  maxPerimeters: z.number().int().min(1).max(20).default(5),
  /** Infill densities searched, %, in steps of `infillStepPct`. */
  minInfillPct: z.number().min(0).max(100).default(5),
  maxInfillPct: z.number().min(0).max(100).default(60),
  infillStepPct: z.number().positive().max(50).default(1),
  /**
   * Largest air cell allowed in the core, mm: above about 6 mm air can circulate in the cells and the conduction
   * model overstates the insulation (Grabowska & Kasperski, Materials 13(19):4400, 2020). 10 mm is their optimum
   * where convection cannot start.
   */
  maxCellMm: z.number().positive().max(50).default(6),
});
/** Optimizer options (see {@link WallOptimizeOptionsSchema}). */
export type WallOptimizeOptions = z.input<typeof WallOptimizeOptionsSchema>;

/** One recipe with its figures. */
export const WallRecipePointSchema = z.object({
  recipe: WallRecipeSchema,
  /** The printer profile the recipe is priced on. */
  printerId: z.string(),
  unitCostCents: z.number(),
  printTimeMin: z.number(),
  massG: z.number(),
  rM2KW: z.number(),
  /** R against a 19 mm pine board. */
  ratioToPine: z.number(),
  /** Estimated air-cell size of the core, mm (null when the wall is all perimeters). */
  cellSizeMm: z.number().nullable(),
});
/** A recipe point (see {@link WallRecipePointSchema}). */
export type WallRecipePoint = z.infer<typeof WallRecipePointSchema>;

/** The optimizer's answer. */
export const WallOptimumSchema = z.object({
  /** R the target asks for, m²K/W. */
  targetRM2KW: z.number(),
  /** The cheapest recipe that meets the target (ties: the faster, then the better insulating); null when none does. */
  best: WallRecipePointSchema.nullable(),
  /** Recipes no other searched recipe beats on cost, print time and R at once, cheapest first. */
  front: z.array(WallRecipePointSchema),
  /** A coarser sample of every searched recipe, for plotting the trade-off around the front. */
  cloud: z.array(WallRecipePointSchema),
  /** Recipes evaluated. */
  searched: z.number().int(),
  /** Why there is no best recipe, when there is none. */
  reason: z.string().nullable(),
  /** The thermal model's limits, for the recipe shown (or the thickest wall when none meets the target). */
  limits: z.array(z.string()),
  currency: z.string(),
});
/** The optimizer's answer (see {@link WallOptimumSchema}). */
export type WallOptimum = z.infer<typeof WallOptimumSchema>;
