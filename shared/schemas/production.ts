import { z } from 'zod';

/** A 3-vector of millimetres (x, y, z). */
const SizeMmSchema = z.object({ x: z.number().positive(), y: z.number().positive(), z: z.number().positive() });

/**
 * A material-extrusion printer in the farm: what it can hold, how fast it can melt plastic and what an hour of it costs.
 */
export const PrinterProfileSchema = z.object({
  id: z.string().min(1),
  name: z.string().min(1),
  /** Usable build volume. */
  buildVolumeMm: SizeMmSchema,
  nozzleMm: z.number().positive(),
  /** Layer height the estimates use. */
  layerHeightMm: z.number().positive(),
  /** Thinnest and thickest layers this nozzle prints well (absent on profiles made before they were added). */
  minLayerHeightMm: z.number().positive().optional(),
  maxLayerHeightMm: z.number().positive().optional(),
  lineWidthMm: z.number().positive(),
  /** Highest volumetric flow the hot end melts reliably (Q = layer height × line width × speed). */
  maxVolumetricFlowMm3s: z.number().positive(),
  /** Average electrical draw over a print (heated bed and hot end included). */
  averagePowerW: z.number().nonnegative(),
  /** Depreciation, maintenance, facility and consumables per productive hour, without electricity. */
  machineRateCentsPerHour: z.number().nonnegative(),
  filamentDiameterMm: z.number().positive(),
  /** Time added at each layer change (z move, retraction, seam): the print-time model's per-layer overhead. */
  layerChangeS: z.number().nonnegative().default(1.5),
  /** Heating the bed and nozzle, probing and purging before each build plate. */
  plateWarmUpMin: z.number().nonnegative().default(6),
  /** Where the profile's values come from (data sheet, measurement, rule of thumb), shown to whoever edits it. */
  sourceNote: z.string().max(1000).optional(),
});
/** A printer profile (see {@link PrinterProfileSchema}). */
export type PrinterProfile = z.infer<typeof PrinterProfileSchema>;

/** One colour of a material, with the solar absorptance that drives the sol-air temperature. */
export const MaterialColourSchema = z.object({
  id: z.string().min(1),
  name: z.string().min(1),
  /** Display colour, #rrggbb. */
  hex: z.string().regex(/^#[0-9a-fA-F]{6}$/),
  /** Fraction of sunlight absorbed, 0–1 (white ≈ 0.25, black ≈ 0.95). */
  solarAbsorptance: z.number().min(0).max(1),
});
/** A material colour (see {@link MaterialColourSchema}). */
export type MaterialColour = z.infer<typeof MaterialColourSchema>;

/** A filament material with the properties costing and outdoor fitness need. */
export const MaterialSchema = z.object({
  id: z.string().min(1),
  name: z.string().min(1),
  densityGcm3: z.number().positive(),
  priceCentsPerKg: z.number().nonnegative(),
  /** Heat-deflection temperature at 0.45 MPa. */
  heatDeflectionC: z.number(),
  glassTransitionC: z.number(),
  /** Thermal conductivity of the solid printed polymer. */
  thermalConductivityWmK: z.number().positive(),
  colours: z.array(MaterialColourSchema).min(1),
});
/** A filament material (see {@link MaterialSchema}). */
export type Material = z.infer<typeof MaterialSchema>;

/** Slicer-like settings that change mass, time and cost. */
export const PrintSettingsSchema = z.object({
  /** Perimeters (walls) on every side of the part. */
  perimeters: z.number().int().min(1).max(20),
  topLayers: z.number().int().min(0).max(50),
  bottomLayers: z.number().int().min(0).max(50),
  /** Sparse infill density of the part's core, 0–100. */
  infillPct: z.number().min(0).max(100),
  /** Density of printed support under overhangs, 0–100. */
  supportInfillPct: z.number().min(0).max(100),
  /** Print speed the slicer aims for on most lines; flow is capped by the printer's maximum. */
  printSpeedMmS: z.number().positive(),
  /**
   * Average share of the target flow really achieved (acceleration, slower outer walls, small layers), 0–1.
   * An assumption, not a measured value: calibrate against slicer estimates of the farm's own parts.
   */
  flowEfficiency: z.number().gt(0).max(1),
  /** Travel moves and retractions as a share of extrusion time, 0–100. */
  travelOverheadPct: z.number().min(0).max(200),
});
/** Print settings (see {@link PrintSettingsSchema}). */
export type PrintSettings = z.infer<typeof PrintSettingsSchema>;

/**
 * A finish and the hand work after printing that it costs per unit: coating, drying handling and packing.
 * Its id is the value of a family's `finish` axis.
 */
export const FinishSchema = z.object({
  id: z
    .string()
    .regex(
      /^[a-z0-9]+(-[a-z0-9]+)*$/,
      'The identifier must be lower-case letters, digits and dashes, such as uv-clear-coat.',
    ),
  name: z.string().min(1).max(80),
  /** Coating by hand (masking, spraying, handling while it dries), minutes per unit; 0 when bare. */
  coatingMin: z.number().nonnegative().max(240),
  /** Packing the finished unit for dispatch, minutes per unit. */
  packingMin: z.number().nonnegative().max(240),
  /** Coating and other consumables per unit. */
  consumablesCents: z.number().nonnegative(),
});
/** A finish (see {@link FinishSchema}). */
export type Finish = z.infer<typeof FinishSchema>;

/** The studio's money rates that turn time and material into a price. */
export const CostRatesSchema = z.object({
  /** ISO 4217 code of every cents value. */
  currency: z.string().regex(/^[A-Z]{3}$/),
  electricityCentsPerKwh: z.number().nonnegative(),
  labourCentsPerHour: z.number().nonnegative(),
  /** Hand work to remove support, per cm³ of support volume. */
  supportRemovalMinPerCm3: z.number().nonnegative(),
  /** Taking a part off the plate and checking it (packing is counted per finish). */
  handlingMinPerUnit: z.number().nonnegative(),
  packagingCents: z.number().nonnegative(),
  /** Share of prints that fail; their material, machine time and energy are charged to the good ones. 0–<100. */
  failureAllowancePct: z.number().min(0).lt(100),
  /** Gross margin on the suggested price (price = cost / (1 − margin)), 0–<100. */
  marginPct: z.number().min(0).lt(100),
  /** Finishes a variant can have, with their post-processing time; the first is used when a variant names none. */
  finishes: z.array(FinishSchema).min(1, 'at least one finish (a bare one) is needed'),
});
/** Cost rates (see {@link CostRatesSchema}). */
export type CostRates = z.infer<typeof CostRatesSchema>;

/** What the mesh analysis knows about one part, in build orientation. */
export const ProductionInputSchema = z.object({
  volumeMm3: z.number().nonnegative(),
  surfaceAreaMm2: z.number().nonnegative(),
  heightMm: z.number().nonnegative(),
  supportVolumeMm3: z.number().nonnegative(),
  bboxSizeMm: z.tuple([z.number().nonnegative(), z.number().nonnegative(), z.number().nonnegative()]),
  /** Area the part covers on the build plate (projected or bed contact). */
  footprintMm2: z.number().nonnegative(),
  /** Area of faces pointing up (top skins); the footprint is used when it is missing. */
  upFacingAreaMm2: z.number().nonnegative().optional(),
  /** Area of faces pointing down (bottom skins); the footprint is used when it is missing. */
  downFacingAreaMm2: z.number().nonnegative().optional(),
});
/** Input of the production estimate (see {@link ProductionInputSchema}). */
export type ProductionInput = z.infer<typeof ProductionInputSchema>;

/** Cost of one good unit, by cause, in whole cents; `totalCents` is their sum. */
export const CostBreakdownSchema = z.object({
  materialCents: z.number().int(),
  machineTimeCents: z.number().int(),
  energyCents: z.number().int(),
  /** Support removal. */
  supportLabourCents: z.number().int(),
  /** Plate removal and inspection. */
  handlingLabourCents: z.number().int(),
  /** Coating and packing of the finish, labour and consumables (0 on costs stored before finishes existed). */
  postProcessingCents: z.number().int().default(0),
  packagingCents: z.number().int(),
  /** Material, machine time and energy of the failed prints, spread over the good ones. */
  failureAllowanceCents: z.number().int(),
  totalCents: z.number().int(),
});
/** A cost breakdown (see {@link CostBreakdownSchema}). */
export type CostBreakdown = z.infer<typeof CostBreakdownSchema>;

/** Mass, filament, time, energy and cost of one unit. */
export const ProductionEstimateSchema = z.object({
  shellVolumeMm3: z.number(),
  infillVolumeMm3: z.number(),
  supportExtrudedVolumeMm3: z.number(),
  extrudedVolumeMm3: z.number(),
  massG: z.number(),
  filamentLengthM: z.number(),
  layers: z.number().int(),
  effectiveFlowMm3s: z.number(),
  printTimeMin: z.number(),
  energyKwh: z.number(),
  currency: z.string(),
  cost: CostBreakdownSchema,
  suggestedPriceCents: z.number().int(),
  /** How the figures were estimated and what they leave out. */
  notes: z.array(z.string()),
});
/** A production estimate (see {@link ProductionEstimateSchema}). */
export type ProductionEstimate = z.infer<typeof ProductionEstimateSchema>;

/** A request for farm capacity: how many units, on how many printers. */
export const FarmCapacityInputSchema = z.object({
  unitsWanted: z.number().int().positive(),
  /** Printers available for the job. */
  printers: z.number().int().positive(),
  /** Machine hours per day (24 for a farm that runs overnight). */
  hoursPerDay: z.number().gt(0).max(24),
  copiesPerPlate: z.number().int().positive(),
  /** Print time of one unit. */
  printTimeMin: z.number().positive(),
  failureRatePct: z.number().min(0).lt(100),
  /** Warm-up and plate change between plates. */
  plateChangeMin: z.number().nonnegative().default(10),
  /** Days added for packing and dispatch. */
  handlingDays: z.number().nonnegative().default(1),
  /**
   * The plate rule of the design (shared/analysis/fitParts.ts unitPlatePlan): one group when a unit's parts print
   * together, one per part when they need plates of their own, each with the units' worth one plate holds and the
   * print time of those parts for one unit. When given, it replaces `copiesPerPlate` and `printTimeMin`.
   */
  plateGroups: z
    .array(z.object({ unitsPerPlate: z.number().int().positive(), printTimeMin: z.number().positive() }))
    .min(1)
    .optional(),
});
/** Farm capacity input (see {@link FarmCapacityInputSchema}). */
export type FarmCapacityInput = z.input<typeof FarmCapacityInputSchema>;

/** How many plates, and how long, a quote needs. */
export const FarmCapacitySchema = z.object({
  plates: z.number().int(),
  /** Plates the farm runs one after another on the busiest printer. */
  platesPerPrinter: z.number().int(),
  /** Time of one plate (of the longest plate group when there are several). */
  plateTimeMin: z.number(),
  /** Plates of each plate group, in the order of the input's groups (one group without them). */
  groups: z
    .array(z.object({ unitsPerPlate: z.number().int(), plates: z.number().int(), plateTimeMin: z.number() }))
    .default([]),
  expectedGoodUnits: z.number(),
  printDays: z.number(),
  leadTimeDays: z.number().int(),
});
/** Farm capacity result (see {@link FarmCapacitySchema}). */
export type FarmCapacity = z.infer<typeof FarmCapacitySchema>;

/**
 * What the studio produces with, as `GET /api/production` answers: the printer profiles and materials from the
 * database, and the print settings and cost rates in force.
 */
export const ProductionCatalogueSchema = z.object({
  printers: z.array(PrinterProfileSchema),
  materials: z.array(MaterialSchema),
  settings: PrintSettingsSchema,
  rates: CostRatesSchema,
});
/** The production catalogue (see {@link ProductionCatalogueSchema}). */
export type ProductionCatalogue = z.infer<typeof ProductionCatalogueSchema>;
