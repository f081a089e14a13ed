/** Shapes of the run planner: what to print in one planned run at a farm, and the plan it gives. */
import { z } from 'zod';

const SizeMmSchema = z.tuple([z.number().nonnegative(), z.number().nonnegative(), z.number().nonnegative()]);

/** One variant in a planned run, with what the engine measured for it. */
export const PlanItemSchema = z.object({
  sku: z.string().min(1),
  /** The variant's mesh hash (what the farm prints), when the item comes from the catalogue. */
  meshSha256: z.string().optional(),
  /** Human name, e.g. the family name and axis values. */
  label: z.string(),
  materialId: z.string().min(1),
  colourId: z.string().min(1),
  /** Units wanted. */
  quantity: z.number().int().min(1).max(100_000),
  /** Bounding-box size of each printable part of one unit in build orientation. */
  partSizesMm: z.array(SizeMmSchema).min(1),
  /** Print time of one unit (all its parts). */
  unitPrintTimeMin: z.number().positive(),
  /** Plastic in one unit. */
  unitMassG: z.number().nonnegative(),
  /** Filament length of one unit. */
  unitFilamentLengthM: z.number().nonnegative(),
  /** The engine's cost of one unit printed (material, machine time, energy, labour, packaging, failures). */
  unitCostCents: z.number().int().nonnegative(),
});
/** One variant in a planned run (see {@link PlanItemSchema}). */
export type PlanItem = z.infer<typeof PlanItemSchema>;

/** The farm and the money rates a plan is made for. */
export const PlanSettingsSchema = z.object({
  /** Build volume of the farm's printers [x, y, z]. */
  buildVolumeMm: SizeMmSchema,
  /** Gap between parts on a plate (10 mm: common practice, no source). */
  spacingMm: z.number().nonnegative().default(10),
  /** Machine warm-up per plate. */
  plateWarmUpMin: z.number().nonnegative(),
  /** Labour to clear a finished plate and start the next. */
  plateChangeMin: z.number().nonnegative().default(5),
  /** Labour to prepare and send one print job (once per on-demand unit, once per run). */
  jobSetupMin: z.number().nonnegative().default(10),
  machineRateCentsPerHour: z.number().nonnegative(),
  averagePowerW: z.number().nonnegative(),
  electricityCentsPerKwh: z.number().nonnegative(),
  labourCentsPerHour: z.number().nonnegative(),
  /** Share of plates that fail and are printed again. */
  failureRatePct: z.number().min(0).lt(100),
  /** Machine hours per printer per day (24 for a farm that runs overnight). */
  hoursPerDay: z.number().gt(0).max(24),
  /** Days at the end kept for packing and shipping. */
  handlingDays: z.number().int().min(0).max(60).default(1),
  /** First day of printing, YYYY-MM-DD. */
  startDate: z.iso.date(),
  /** Day the run must be finished (printed and handled) by, YYYY-MM-DD. */
  finishBy: z.iso.date(),
  currency: z.string().regex(/^[A-Z]{3}$/),
});
/** Plan settings as given (defaults optional). */
export type PlanSettingsInput = z.input<typeof PlanSettingsSchema>;
/** Plan settings with defaults filled in. */
export type PlanSettings = z.infer<typeof PlanSettingsSchema>;

/** One part placed on a plate; x/y is the corner of its footprint, without the gap. */
export const PlacedPartSchema = z.object({
  sku: z.string(),
  /** Which part of the unit (0 = first). */
  part: z.number().int(),
  xMm: z.number(),
  yMm: z.number(),
  /** Footprint as placed (after any turn). */
  widthMm: z.number(),
  depthMm: z.number(),
  turned: z.boolean(),
});
/** A placed part (see {@link PlacedPartSchema}). */
export type PlacedPart = z.infer<typeof PlacedPartSchema>;

/** One build plate of the run. */
export const PlannedPlateSchema = z.object({
  index: z.number().int(),
  materialId: z.string(),
  colourId: z.string(),
  parts: z.array(PlacedPartSchema),
  /** Print time of the parts plus warm-up. */
  printTimeMin: z.number(),
  /** Share of the plate covered by footprints (without gaps), 0–100. */
  coveragePct: z.number(),
});
/** A planned plate (see {@link PlannedPlateSchema}). */
export type PlannedPlate = z.infer<typeof PlannedPlateSchema>;

/** Per-variant figures of a plan. */
export const PlanLineSchema = z.object({
  sku: z.string(),
  label: z.string(),
  quantity: z.number().int(),
  /** Cost of one unit printed on demand: alone on a plate, one job each. */
  onDemandUnitCents: z.number().int(),
  /** Cost of one unit in this run: plate set-up shared with its plate-mates, one job for the run. */
  runUnitCents: z.number().int(),
  savingUnitCents: z.number().int(),
});
/** A plan line (see {@link PlanLineSchema}). */
export type PlanLine = z.infer<typeof PlanLineSchema>;

/** Filament for one material and colour. */
export const PlanFilamentSchema = z.object({
  materialId: z.string(),
  colourId: z.string(),
  /** Including the reprint allowance. */
  massG: z.number(),
  lengthM: z.number(),
  /** 1 kg spools to have on hand. */
  spools: z.number().int(),
});
/** Filament by colour (see {@link PlanFilamentSchema}). */
export type PlanFilament = z.infer<typeof PlanFilamentSchema>;

/** The plates one printer runs, in order. */
export const PrinterQueueSchema = z.object({
  printer: z.number().int(),
  plates: z.array(z.object({ plate: z.number().int(), startH: z.number(), endH: z.number() })),
  busyH: z.number(),
});
/** A printer's queue (see {@link PrinterQueueSchema}). */
export type PrinterQueue = z.infer<typeof PrinterQueueSchema>;

/** A run plan. */
export const RunPlanSchema = z.object({
  plates: z.array(PlannedPlateSchema),
  /** Fewest plates any packing could use: total footprint area (with gaps) over plate area, per colour. */
  lowerBoundPlates: z.number().int(),
  /** Machine hours of every plate, plus the reprint allowance. */
  printerHours: z.number(),
  reprintAllowanceH: z.number(),
  /** Machine hours one printer has between the start and the finish date less the handling days. */
  hoursAvailablePerPrinter: z.number(),
  /** Fewest printers that finish every plate in time (0 when the date leaves no printing time). */
  printersNeeded: z.number().int(),
  /** Plates per printer with those printers (longest plates first, each to the printer free soonest). */
  schedule: z.array(PrinterQueueSchema),
  /** Hours until the last plate is off, with {@link printersNeeded} printers (reprints included). */
  finishH: z.number(),
  /** Whether the run can finish by the date at all. */
  feasible: z.boolean(),
  filament: z.array(PlanFilamentSchema),
  lines: z.array(PlanLineSchema),
  totals: z.object({
    units: z.number().int(),
    onDemandCents: z.number().int(),
    runCents: z.number().int(),
    savingCents: z.number().int(),
    savingPct: z.number(),
  }),
  currency: z.string(),
  /** How the figures were reached and what they leave out. */
  notes: z.array(z.string()),
});
/** A run plan (see {@link RunPlanSchema}). */
export type RunPlan = z.infer<typeof RunPlanSchema>;
