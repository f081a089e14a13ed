import { z } from 'zod';

/** Where a species table row applies. */
export const RegionSchema = z.enum(['north-america', 'europe']);
/** A region (see {@link RegionSchema}). */
export type Region = z.infer<typeof RegionSchema>;

/** An inclusive range; min === max where the source gives one value. */
const RangeSchema = z.object({ min: z.number(), max: z.number() });

/** One row of the species table: the box a species uses, as published, with its source. */
export const SpeciesSchema = z.object({
  id: z.string().min(1),
  commonName: z.string().min(1),
  scientificName: z.string().min(1),
  region: RegionSchema,
  /** Round entry hole; for an oval entry, its width. */
  holeDiameterMm: RangeSchema,
  /** Oval entry height; absent for a round hole. */
  holeHeightMm: RangeSchema.optional(),
  /** Inside floor, side of a square (the smaller side of a rectangle). */
  floorMm: RangeSchema,
  /** Floor to roof inside. */
  cavityDepthMm: RangeSchema,
  /** Floor to the entry hole. */
  holeAboveFloorMm: RangeSchema,
  /** Height of the box above the ground. */
  mountingHeightM: RangeSchema,
  /** Native and welcome in this region; false for species a box should keep out (e.g. starlings in North America). */
  wanted: z.boolean(),
  source: z.string().min(1),
  /** Where sources disagree, or a value is computed or from memory. */
  notes: z.string().optional(),
});
/** A species row (see {@link SpeciesSchema}). */
export type Species = z.infer<typeof SpeciesSchema>;

/** info: good to know; caution: check before you sell; warning: can harm birds or keep them away. */
export const BirdFitSeveritySchema = z.enum(['info', 'caution', 'warning']);
/** Warning severity (see {@link BirdFitSeveritySchema}). */
export type BirdFitSeverity = z.infer<typeof BirdFitSeveritySchema>;

/** One piece of guidance about the box, with where it comes from. */
export const BirdFitWarningSchema = z.object({
  code: z.enum([
    'perch',
    'admits-starlings',
    'admits-house-sparrows',
    'no-drainage',
    'no-ventilation',
    'hole-too-high-for-cavity',
    'hole-low-above-floor',
    'thin-walls',
    'no-cleaning-access',
    'mounting-height',
    'predator-guard',
    'plastic-heat',
    'no-species-match',
  ]),
  severity: BirdFitSeveritySchema,
  /** Only for this region, when the advice is regional. */
  region: RegionSchema.optional(),
  message: z.string(),
  source: z.string(),
});
/** A bird-fit warning (see {@link BirdFitWarningSchema}). */
export type BirdFitWarning = z.infer<typeof BirdFitWarningSchema>;

/** The verdict for one species. */
export const SpeciesFitSchema = z.object({
  speciesId: z.string(),
  commonName: z.string(),
  region: RegionSchema,
  suits: z.boolean(),
  /** Why not (empty when it suits). */
  reasons: z.array(z.string()),
  mountingHeightM: RangeSchema,
  source: z.string(),
});
/** A species verdict (see {@link SpeciesFitSchema}). */
export type SpeciesFit = z.infer<typeof SpeciesFitSchema>;

/** Which species a box suits and what to watch. */
export const BirdFitResultSchema = z.object({
  /** Wanted species the box suits. */
  suits: z.array(SpeciesFitSchema),
  /** Every species row with its verdict. */
  species: z.array(SpeciesFitSchema),
  warnings: z.array(BirdFitWarningSchema),
});
/** Bird-fit result (see {@link BirdFitResultSchema}). */
export type BirdFitResult = z.infer<typeof BirdFitResultSchema>;
