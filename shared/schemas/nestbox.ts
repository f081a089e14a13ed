import { z } from 'zod';

/**
 * What a nest box offers a bird, measured on the design (inside dimensions, millimetres).
 * Templates report it from their parameters; the bird-fit rules read it.
 */
export const NestBoxFactsSchema = z.object({
  /** Entry width; for a round hole its diameter. */
  entryHoleDiameterMm: z.number().positive(),
  /** Entry height where the hole is oval; omitted for a round hole. */
  entryHoleHeightMm: z.number().positive().optional(),
  /** Inside floor, side to side. */
  floorWidthMm: z.number().positive(),
  /** Inside floor, front to back. */
  floorDepthMm: z.number().positive(),
  /** Inside height from floor to the lowest point of the roof. */
  cavityDepthMm: z.number().positive(),
  /** Floor to the bottom edge of the entry hole. */
  holeAboveFloorMm: z.number().nonnegative(),
  /** Thinnest wall of the chamber. */
  wallThicknessMm: z.number().positive(),
  hasPerch: z.boolean(),
  drainageHoleCount: z.number().int().nonnegative(),
  ventilationAreaMm2: z.number().nonnegative(),
  cleaningAccess: z.boolean(),
  /** Number of separate chambers (storeys), each with its own entry. */
  chambers: z.number().int().positive().default(1),
});
/** What a nest box offers a bird (see {@link NestBoxFactsSchema}). */
export type NestBoxFacts = z.infer<typeof NestBoxFactsSchema>;
