/**
 * Variants of a family revision and their computation: the compute status and progress events, the per-variant
 * report, cost and verdict, and the variant list query and answer.
 *
 * Routes: `POST /api/families/:id/compute` and `/cancel` -> {@link ComputeStatus}; `GET /api/families/:id/progress`
 * (event stream of {@link ComputeProgressEvent}); `GET /api/families/:id/variants` -> {@link VariantListResponse}.
 */
import { z } from 'zod';
import { BirdFitWarningSchema } from './birdfit';
import { CostBreakdownSchema } from './production';
import { NestBoxFactsSchema } from './nestbox';
import { OutdoorAssessmentSchema } from './outdoor';
import { TargetCheckSchema } from './wallRecipe';
import { AxisValueSchema, FAMILY_MAX_VARIANTS, VariantAttributesSchema } from './familySpec';

/** Status of a family revision's computation. */
export const ComputeStateSchema = z.enum(['idle', 'queued', 'running', 'done', 'cancelled', 'failed']);
/** Computation state (see {@link ComputeStateSchema}). */
export type ComputeState = z.infer<typeof ComputeStateSchema>;

/** Where the computation of the current revision stands. */
export const ComputeStatusSchema = z.object({
  state: ComputeStateSchema,
  doneCount: z.number().int().nonnegative(),
  total: z.number().int().nonnegative(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  /** Why it failed, when it failed. */
  error: z.string().nullable(),
});
/** Computation status (see {@link ComputeStatusSchema}). */
export type ComputeStatus = z.infer<typeof ComputeStatusSchema>;

/** One SSE event of `GET /api/families/:id/progress`. */
export const ComputeProgressEventSchema = z.object({
  familyId: z.string(),
  revision: z.number().int(),
  state: ComputeStateSchema,
  doneCount: z.number().int(),
  total: z.number().int(),
  /** The variant just finished (absent on the first event and on `done`). */
  variant: z.object({ sku: z.string(), verdict: z.enum(['pass', 'warn', 'fail']) }).optional(),
});
/** A progress event (see {@link ComputeProgressEventSchema}). */
export type ComputeProgressEvent = z.infer<typeof ComputeProgressEventSchema>;

/** The print-readiness figures kept per variant (summary of the full analysis report). */
export const VariantReportSchema = z.object({
  triangles: z.number().int(),
  volumeMm3: z.number(),
  surfaceAreaMm2: z.number(),
  /** Every edge shared by exactly two triangles in opposite directions. */
  watertight: z.boolean(),
  openEdges: z.number().int(),
  nonManifoldEdges: z.number().int(),
  components: z.number().int(),
  partCount: z.number().int(),
  bboxSizeMm: z.tuple([z.number(), z.number(), z.number()]),
  /**
   * Size of each printable part in build orientation, in the order the template builds them (the body first). Kept
   * so that the run planner and the shop need not rebuild the mesh; absent on variants computed before it was kept.
   */
  partSizesMm: z.array(z.tuple([z.number(), z.number(), z.number()])).optional(),
  overhangAreaMm2: z.number(),
  supportVolumeMm3: z.number(),
  maxBridgeSpanMm: z.number(),
  thinnestWallMm: z.number().nullable(),
  printerId: z.string(),
  fitsPrinter: z.boolean(),
  /** Complete units on one plate when the parts go together; else the copies of the part that fits fewest. */
  copiesPerPlate: z.number().int(),
  /**
   * The plate rule on the variant's printer (shared/analysis/plateRule.ts): together, one plate group per part, or
   * none; absent on variants computed before it was kept (then derived from `partSizesMm`).
   */
  plate: z
    .object({
      layout: z.enum(['together', 'separate', 'none']),
      platesPerUnit: z.number().int(),
      groups: z.array(z.object({ partIndexes: z.array(z.number().int()), unitsPerPlate: z.number().int() })),
      text: z.string(),
    })
    .optional(),
  massG: z.number(),
  filamentLengthM: z.number(),
  printTimeMin: z.number(),
  /** The bird-facing facts the template reported. */
  facts: NestBoxFactsSchema,
  /** Things a person should look at before printing. */
  warnings: z.array(z.string()),
  /**
   * Outdoor fitness in the variant's material and colour: roof and wall sol-air temperatures against the material's
   * heat-deflection temperature (absent on variants computed before it was added, or for an unknown colour).
   */
  outdoor: OutdoorAssessmentSchema.optional(),
  /** The family's production targets checked against this variant (empty when the family sets none). */
  targetChecks: z.array(TargetCheckSchema).default([]),
});
/** A variant's report summary (see {@link VariantReportSchema}). */
export type VariantReport = z.infer<typeof VariantReportSchema>;

/** Unit cost and suggested price of a variant. */
export const VariantCostSchema = z.object({
  currency: z.string(),
  costCents: z.number().int(),
  breakdown: CostBreakdownSchema,
  suggestedPriceCents: z.number().int(),
});
/** A variant's cost (see {@link VariantCostSchema}). */
export type VariantCost = z.infer<typeof VariantCostSchema>;

/** pass: ready; warn: printable with bird-fit warnings to acknowledge; fail: blocks the gate. */
export const VariantVerdictSchema = z.enum(['pass', 'warn', 'fail']);
/** A variant verdict (see {@link VariantVerdictSchema}). */
export type VariantVerdict = z.infer<typeof VariantVerdictSchema>;

/** One variant of a family revision. */
export const VariantSchema = z.object({
  id: z.string(),
  /** Position in the matrix (axis order, last axis fastest). */
  index: z.number().int(),
  sku: z.string(),
  /** Canonical JSON of the axis values, sorted by key: the identity the SKU is derived from. */
  variantKey: z.string(),
  /** This variant's value on each axis, by axis key. */
  axisValues: z.record(z.string(), AxisValueSchema),
  /** Complete template parameters (base + axis values, defaults merged). */
  params: z.record(z.string(), AxisValueSchema),
  attributes: VariantAttributesSchema,
  status: z.enum(['pending', 'done', 'failed']),
  /** sha256 of the canonical mesh bytes; null until computed. */
  sha256: z.string().nullable(),
  report: VariantReportSchema.nullable(),
  cost: VariantCostSchema.nullable(),
  verdict: VariantVerdictSchema.nullable(),
  /** Why the verdict is what it is (empty for a clean pass). */
  reasons: z.array(z.string()),
  birdFitWarnings: z.array(BirdFitWarningSchema),
  /** Generation error when status is failed. */
  error: z.string().nullable(),
});
/** One variant (see {@link VariantSchema}). */
export type Variant = z.infer<typeof VariantSchema>;

/** Sort keys of the variant table. */
export const VariantSortSchema = z.enum(['index', 'sku', 'verdict', 'costCents', 'supportVolumeMm3', 'printTimeMin']);
/** A sort key of the variant table (see {@link VariantSortSchema}). */
export type VariantSort = z.infer<typeof VariantSortSchema>;

/** Query of `GET /api/families/:id/variants`. */
export const VariantListQuerySchema = z.object({
  /** Revision number; the current revision when omitted. */
  revision: z.coerce.number().int().positive().optional(),
  verdict: VariantVerdictSchema.optional(),
  /** Substring of the SKU (case-insensitive). */
  q: z.string().max(80).optional(),
  sort: VariantSortSchema.default('index'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().positive().default(1),
  pageSize: z.coerce.number().int().positive().max(FAMILY_MAX_VARIANTS).default(50),
});
/** Query of `GET /api/families/:id/variants`. */
export type VariantListQuery = z.infer<typeof VariantListQuerySchema>;

/** Answer of `GET /api/families/:id/variants`. */
export const VariantListResponseSchema = z.object({
  variants: z.array(VariantSchema),
  /** Variants matching the filter (before paging). */
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  revision: z.number().int(),
});
/** Answer of `GET /api/families/:id/variants`. */
export type VariantListResponse = z.infer<typeof VariantListResponseSchema>;
