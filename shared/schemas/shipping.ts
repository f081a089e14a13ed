import { z } from 'zod';

/** The unit system a dimensional-weight divisor works in. */
export const DimUnitSystemSchema = z.enum(['imperial', 'metric']);
/** `imperial`: inches and pounds (divisor in in³/lb); `metric`: centimetres and kilograms (divisor in cm³/kg). */
export type DimUnitSystem = z.infer<typeof DimUnitSystemSchema>;

/**
 * A carrier's dimensional-weight divisor, kept as a setting with the date it took effect: divisors are carrier- and
 * contract-specific and change over time (UPS/FedEx US domestic 166 → 139 in 2017, USPS 194 → 166 in 2019).
 */
export const DimDivisorSchema = z.object({
  id: z.string().trim().min(1).max(40),
  /** Who applies it, in generic words customers may read, e.g. "Parcel carrier, US domestic" (the carrier stays in `source`). */
  label: z.string().trim().min(1).max(80),
  unitSystem: DimUnitSystemSchema,
  /** in³ per lb (imperial) or cm³ per kg (metric). */
  divisor: z.number().positive(),
  /** The date the divisor took effect, YYYY-MM-DD. */
  effectiveFrom: z.iso.date(),
  /** Dimensional weight applies only to parcels larger than this (in³ or cm³); 0 = always. */
  appliesAboveVolume: z.number().nonnegative().default(0),
  /** Where the figure comes from. */
  source: z.string().trim().max(300).default(''),
});
/** A dimensional-weight divisor (see {@link DimDivisorSchema}). */
export type DimDivisor = z.infer<typeof DimDivisorSchema>;

/** How a product is packed: padding around it, the carton board and the fill. */
export const PackagingRulesSchema = z.object({
  /** Clear space around the product on every side (fill). */
  paddingMm: z.number().nonnegative().max(200),
  /** Inside box dimensions are rounded up to a multiple of this. */
  boxStepMm: z.number().positive().max(100),
  /** Carton board thickness; the outside is the inside plus two boards. */
  boardThicknessMm: z.number().nonnegative().max(20),
  /** Board mass per square metre (grammage of the combined board). */
  boardGsm: z.number().nonnegative().max(5000),
  /** Fill, tape and label per parcel. */
  fillMassG: z.number().nonnegative().max(5000),
});
/** Packaging rules (see {@link PackagingRulesSchema}). */
export type PackagingRules = z.infer<typeof PackagingRulesSchema>;

/** Length, width and height in millimetres, largest first. */
export const BoxDimensionsMmSchema = z.tuple([z.number().positive(), z.number().positive(), z.number().positive()]);
/** Box dimensions in millimetres. */
export type BoxDimensionsMm = z.infer<typeof BoxDimensionsMmSchema>;

/** The carton for one unit. */
export const ShippingBoxSchema = z.object({
  innerMm: BoxDimensionsMmSchema,
  outerMm: BoxDimensionsMmSchema,
  /** Carton board plus fill. */
  packagingMassG: z.number().nonnegative(),
  /** Product plus packaging. */
  actualMassG: z.number().nonnegative(),
});
/** The carton for one unit (see {@link ShippingBoxSchema}). */
export type ShippingBox = z.infer<typeof ShippingBoxSchema>;

/** Dimensional and billable weight of one parcel under one divisor, in that divisor's units. */
export const DimWeightSchema = z.object({
  divisorId: z.string(),
  label: z.string(),
  unitSystem: DimUnitSystemSchema,
  divisor: z.number(),
  effectiveFrom: z.string(),
  /** Each outside dimension rounded to the nearest whole inch or centimetre. */
  roundedDimensions: z.tuple([z.number(), z.number(), z.number()]),
  /** Product of the rounded dimensions (in³ or cm³). */
  volume: z.number(),
  /** Dimensional weight before rounding (lb or kg). */
  dimWeightExact: z.number(),
  /** Dimensional weight rounded up to the next whole lb or kg; 0 when the parcel is under `appliesAboveVolume`. */
  dimWeight: z.number(),
  /** Actual weight rounded up to the next whole lb or kg. */
  actualWeight: z.number(),
  /** max(actual, dimensional), both rounded up. */
  billableWeight: z.number(),
  weightUnit: z.enum(['lb', 'kg']),
});
/** Dimensional weight result (see {@link DimWeightSchema}). */
export type DimWeight = z.infer<typeof DimWeightSchema>;
