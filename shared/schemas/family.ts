/**
 * Variant families, review and publishing: every request and response shape of the family, catalogue, photo and
 * mail APIs. This file is the contract the screens are built against: add fields, never rename.
 *
 * Routes (all JSON unless noted; errors use shared/schemas/error.ts):
 * - `GET  /api/families?state=&q=`              designer, catalogue_manager -> {@link FamilyListResponse}
 * - `POST /api/families`                        designer  body {@link FamilyCreate} -> 201 {@link FamilyResponse}
 * - `GET  /api/families/:id`                    designer, catalogue_manager -> {@link FamilyResponse}
 * - `PATCH /api/families/:id`                   designer  body {@link FamilyUpdate} -> {@link FamilyResponse}
 *     (editing a draft changes it; editing an approved/published/retired family opens a new draft revision, the
 *     published one stays in the catalogue until the new revision is published; in_review -> 409)
 * - `POST /api/families/:id/compute`            designer  -> 202 {@link ComputeStatus} (background job)
 * - `POST /api/families/:id/cancel`             designer  -> {@link ComputeStatus}
 * - `GET  /api/families/:id/progress`           designer, catalogue_manager; `text/event-stream`:
 *     `event: progress` data {@link ComputeProgressEvent} once on connect and once per variant,
 *     `event: done` data {@link ComputeProgressEvent} when the job ends (done, cancelled or failed), then closes.
 * - `GET  /api/families/:id/variants?revision=&verdict=&q=&sort=&dir=&page=&pageSize=`
 *                                               designer, catalogue_manager -> {@link VariantListResponse}
 * - `POST /api/families/:id/acknowledgements`   designer  body {@link AcknowledgementsCreate} -> {@link FamilyResponse}
 * - `POST /api/families/:id/submit`             designer  body {} -> {@link FamilyResponse};
 *     409 `gate_failed` with `details` = {@link FamilyGate} when the gate blocks
 * - `POST /api/families/:id/approve`            catalogue_manager body {@link ReviewDecision} -> {@link FamilyResponse}
 * - `POST /api/families/:id/return`             catalogue_manager body {@link ReturnDecision} -> {@link FamilyResponse}
 * - `POST /api/families/:id/publish`            catalogue_manager body {} -> {@link FamilyResponse}
 * - `POST /api/families/:id/retire`             catalogue_manager body {} -> {@link FamilyResponse}
 *     State changes the state does not allow -> 409 `invalid_state` naming the state; a lost race -> 409
 *     `state_changed`. Every transition body may carry `expectedRevision` / `expectedLock` to act on what was seen.
 * - `GET  /api/families/:id/diff?from=&to=`     designer, catalogue_manager -> {@link RevisionDiff} (revision numbers)
 * - `GET  /api/families/:id/audit`              designer, catalogue_manager -> {@link AuditListResponse}
 * - `POST /api/families/:id/photos`             designer; multipart/form-data field `photo` (JPEG/PNG/WebP, at most
 *     {@link PHOTO_MAX_BYTES} bytes, checked by content) and optional field `caption` -> 201 {@link PhotoResponse}
 * - `GET  /api/photos/:id`                      signed-in; the 1600 px normalised copy (image/webp)
 * - `GET  /api/photos/:id/thumb`                signed-in; the 320 px thumbnail (image/webp)
 * - `GET  /api/catalogue?q=&familyId=&colour=&material=`
 *                                               sales, catalogue_manager, designer -> {@link CatalogueResponse}
 * - `GET  /api/mail/messages`                   admin -> {@link MailMessagesResponse}
 *
 * SKU scheme (see shared/families/sku.ts): `FH-<family code>-<one segment per axis, in axis order>`, each segment the
 * code of that variant's value on the axis: numbers as digits with `P` for the decimal point (`32`, `27P5`), words
 * as their first four letters or digits upper-cased (`none` -> `NONE`, `shingles` -> `SHIN`, `moss-green` -> `MOSS`),
 * booleans `Y`/`N`. A segment depends only on the value, so a variant keeps its SKU as long as the family keeps its
 * code and its axis order; two values of one axis with the same code are rejected (400 naming the field).
 * Example: family code `HGB`, axes entry 25/28/32 x trim none/shingles x colour sand/moss-green ->
 * `FH-HGB-28-SHIN-SAND`.
 */
import { z } from 'zod';
import { BirdFitSeveritySchema, BirdFitWarningSchema, RegionSchema } from './birdfit';
import { CostBreakdownSchema } from './production';
import { NestBoxFactsSchema } from './nestbox';
import { OutdoorAssessmentSchema } from './outdoor';

/** Most variants one family may have; more is refused with a message naming the count. */
export const FAMILY_MAX_VARIANTS = 500;

/** Largest photo upload in bytes (8 MB). */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;

/** Longest side of a photo thumbnail, px. */
export const PHOTO_THUMB_PX = 320;

/** Longest side of the normalised photo copy, px. */
export const PHOTO_NORMAL_PX = 1600;

/** Shortest acknowledgement text a designer must write for a bird-fit warning. */
export const ACK_MIN_CHARS = 10;

/** Prefix of every SKU (the demo studio's mark). */
export const SKU_PREFIX = 'FH';

/** A SKU as the scheme above writes it, e.g. `FH-HGB-28-SHIN-SAND`. */
export const SkuSchema = z
  .string()
  .regex(/^FH-[A-Z0-9]{2,6}(-[A-Z0-9]{1,8})*$/, 'sku must look like FH-HGB-28-SHIN-SAND');

/** Review states of a family revision, in workflow order. */
export const FAMILY_STATES = ['draft', 'in_review', 'approved', 'published', 'retired'] as const;
/** A review state: draft -> in_review -> approved -> published -> retired; return sends in_review back to draft. */
export const FamilyStateSchema = z.enum(FAMILY_STATES);
/** A review state (see {@link FamilyStateSchema}). */
export type FamilyState = z.infer<typeof FamilyStateSchema>;

/** Human labels of the states. */
export const FAMILY_STATE_LABELS: Record<FamilyState, string> = {
  draft: 'Draft',
  in_review: 'In review',
  approved: 'Approved',
  published: 'Published',
  retired: 'Retired',
};

/** Workflow actions recorded in the audit log and offered as buttons. */
export const FamilyActionSchema = z.enum(['submit', 'approve', 'return', 'publish', 'retire']);
/** A workflow action (see {@link FamilyActionSchema}). */
export type FamilyAction = z.infer<typeof FamilyActionSchema>;

/** Short code of a family inside its SKUs: 2–6 upper-case letters or digits, unique per studio. */
export const FamilyCodeSchema = z
  .string()
  .trim()
  .regex(/^[A-Z0-9]{2,6}$/, 'code must be 2 to 6 upper-case letters or digits');

/** A value on a parameter axis: a number (mm, degrees, count), a choice word or a boolean. */
export const AxisValueSchema = z.union([z.number(), z.string().min(1).max(40), z.boolean()]);
/** A value on an axis (see {@link AxisValueSchema}). */
export type AxisValue = z.infer<typeof AxisValueSchema>;

/** Keys of the non-geometric axes. */
export const ATTRIBUTE_KEYS = ['colour', 'material', 'finish'] as const;
/** A non-geometric axis key. */
export const AttributeKeySchema = z.enum(ATTRIBUTE_KEYS);
/** A non-geometric axis key (see {@link AttributeKeySchema}). */
export type AttributeKey = z.infer<typeof AttributeKeySchema>;

/** Values of attribute axes are ids: lower-case words joined by hyphens, e.g. `moss-green`, `uv-clear-coat`. */
export const AttributeValueSchema = z
  .string()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'value must be a lower-case id such as uv-clear-coat')
  .max(40);

function noDuplicates(values: readonly unknown[], ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  values.forEach((value, index) => {
    const key = JSON.stringify(value);
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: [index], message: `duplicate value ${key}` });
    seen.add(key);
  });
}

/** A parameter axis: a template parameter and the listed values it takes (checked with the template's ranges). */
export const ParamAxisSchema = z.object({
  kind: z.literal('param'),
  /** A parameter key of the pinned template, e.g. `entryHoleDiameterMm`. */
  key: z.string().min(1).max(64),
  /** Optional display label (defaults to the template's label). */
  label: z.string().max(80).optional(),
  values: z.array(AxisValueSchema).min(1, 'an axis needs at least one value').max(50).superRefine(noDuplicates),
});
/** A parameter axis (see {@link ParamAxisSchema}). */
export type ParamAxis = z.infer<typeof ParamAxisSchema>;

/** A non-geometric axis: colour (material colour ids), material (material ids) or finish (free ids). */
export const AttributeAxisSchema = z.object({
  kind: z.literal('attribute'),
  key: AttributeKeySchema,
  label: z.string().max(80).optional(),
  values: z.array(AttributeValueSchema).min(1, 'an axis needs at least one value').max(50).superRefine(noDuplicates),
});
/** A non-geometric axis (see {@link AttributeAxisSchema}). */
export type AttributeAxis = z.infer<typeof AttributeAxisSchema>;

/** One axis of the variant matrix. */
export const AxisSchema = z.discriminatedUnion('kind', [ParamAxisSchema, AttributeAxisSchema]);
/** One axis (see {@link AxisSchema}). */
export type Axis = z.infer<typeof AxisSchema>;

/** The axes of a family: at most 6, each key once. */
export const AxesSchema = z
  .array(AxisSchema)
  .max(6, 'at most 6 axes')
  .superRefine((axes, ctx) => {
    const seen = new Set<string>();
    axes.forEach((axis, index) => {
      if (seen.has(axis.key))
        ctx.addIssue({ code: 'custom', path: [index, 'key'], message: `duplicate axis ${axis.key}` });
      seen.add(axis.key);
    });
  });

/** A variant's non-geometric attributes (material always set: the axis value or the family default). */
export const VariantAttributesSchema = z.object({
  colour: z.string().nullable(),
  material: z.string(),
  finish: z.string().nullable(),
});
/** A variant's attributes (see {@link VariantAttributesSchema}). */
export type VariantAttributes = z.infer<typeof VariantAttributesSchema>;

/** The part of a family a designer edits (one revision's content). */
export const FamilySpecSchema = z.object({
  name: z.string().trim().min(1, 'name is required').max(80),
  description: z.string().max(2000).default(''),
  templateId: z.string().min(1).max(64),
  /** Parameters shared by every variant (missing keys take the template defaults). */
  baseParams: z.record(z.string(), AxisValueSchema).default({}),
  axes: AxesSchema,
  /** Largest support volume a variant may need, mm³. */
  supportBudgetMm3: z.number().nonnegative().max(10_000_000),
  /** Printer every variant must fit (DEFAULT_PRINTERS / printer_profiles id). */
  printerId: z.string().min(1).default('workhorse-220'),
  /** Material when there is no material axis. */
  materialId: z.string().min(1).default('pla'),
  /** Region for the bird-fit rules; both regions when null. */
  region: RegionSchema.nullable().default(null),
});
/** A family's editable content (see {@link FamilySpecSchema}). */
export type FamilySpec = z.infer<typeof FamilySpecSchema>;

/** Body of `POST /api/families` (the template version is pinned to the current one). */
export const FamilyCreateSchema = FamilySpecSchema.extend({ code: FamilyCodeSchema });
/** Body of `POST /api/families`. */
export type FamilyCreate = z.input<typeof FamilyCreateSchema>;

/**
 * Body of `PATCH /api/families/:id`: any spec fields. `templateVersion: 'latest'` re-pins to the current template
 * version. `expectedLock` (from {@link Family.lock}) makes a stale edit a 409.
 */
export const FamilyUpdateSchema = z
  .object({
    name: FamilySpecSchema.shape.name,
    description: z.string().max(2000),
    templateId: FamilySpecSchema.shape.templateId,
    templateVersion: z.literal('latest'),
    baseParams: z.record(z.string(), AxisValueSchema),
    axes: AxesSchema,
    supportBudgetMm3: FamilySpecSchema.shape.supportBudgetMm3,
    printerId: z.string().min(1),
    materialId: z.string().min(1),
    region: RegionSchema.nullable(),
    expectedLock: z.number().int().nonnegative(),
  })
  .partial()
  .strict();
/** Body of `PATCH /api/families/:id`. */
export type FamilyUpdate = z.infer<typeof FamilyUpdateSchema>;

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
  overhangAreaMm2: z.number(),
  supportVolumeMm3: z.number(),
  maxBridgeSpanMm: z.number(),
  thinnestWallMm: z.number().nullable(),
  printerId: z.string(),
  fitsPrinter: z.boolean(),
  copiesPerPlate: z.number().int(),
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

/** A person as the workflow shows them. */
export const ActorSchema = z.object({ id: z.string(), name: z.string() });
/** A person as the workflow shows them. */
export type Actor = z.infer<typeof ActorSchema>;

/** Codes of outdoor-fitness warnings the gate raises (a roof or wall in full sun above the heat-deflection temperature). */
export const OutdoorWarningCodeSchema = z.enum(['outdoor-heat']);
/** An outdoor warning code (see {@link OutdoorWarningCodeSchema}). */
export type OutdoorWarningCode = z.infer<typeof OutdoorWarningCodeSchema>;

/** Every code the gate may ask to acknowledge: bird-fit warning codes and outdoor warning codes. */
export const GateWarningCodeSchema = z.union([BirdFitWarningSchema.shape.code, OutdoorWarningCodeSchema]);
/** A warning code of the gate (see {@link GateWarningCodeSchema}). */
export type GateWarningCode = z.infer<typeof GateWarningCodeSchema>;

/** A written acknowledgement of one bird-fit or outdoor warning code, for one revision. */
export const AcknowledgementSchema = z.object({
  code: GateWarningCodeSchema,
  text: z.string(),
  by: ActorSchema,
  at: z.string(),
});
/** An acknowledgement (see {@link AcknowledgementSchema}). */
export type Acknowledgement = z.infer<typeof AcknowledgementSchema>;

/** Body of `POST /api/families/:id/acknowledgements`: one text per warning code (replaces an earlier one). */
export const AcknowledgementsCreateSchema = z.object({
  acknowledgements: z
    .array(
      z.object({
        code: GateWarningCodeSchema,
        text: z.string().trim().min(ACK_MIN_CHARS, `text must be at least ${ACK_MIN_CHARS} characters`).max(2000),
      }),
    )
    .min(1),
});
/** Body of `POST /api/families/:id/acknowledgements`. */
export type AcknowledgementsCreate = z.infer<typeof AcknowledgementsCreateSchema>;

/** Why the gate blocks a submit. */
export const GateBlockerCodeSchema = z.enum([
  'not_computed',
  'generation_failed',
  'not_closed',
  'not_manifold',
  'does_not_fit',
  'over_support_budget',
  'birdfit_unacknowledged',
  'stale_template',
  'outdoor_unacknowledged',
]);

/** One reason the gate blocks, with the SKUs it concerns. */
export const GateBlockerSchema = z.object({
  code: GateBlockerCodeSchema,
  message: z.string(),
  skus: z.array(z.string()),
});
/** A gate blocker (see {@link GateBlockerSchema}). */
export type GateBlocker = z.infer<typeof GateBlockerSchema>;

/** A bird-fit or outdoor warning code raised by some variants, and whether it is acknowledged. */
export const GateWarningSchema = z.object({
  code: GateWarningCodeSchema,
  severity: BirdFitSeveritySchema,
  /** The message of the first variant that raised it. */
  message: z.string(),
  source: z.string(),
  skus: z.array(z.string()),
  acknowledgement: AcknowledgementSchema.nullable(),
});
/** A warning to acknowledge (see {@link GateWarningSchema}). */
export type GateWarning = z.infer<typeof GateWarningSchema>;

/**
 * The family gate: submit is allowed only when `ok`. Bird-fit warnings of severity `warning` must be acknowledged,
 * as must `outdoor-heat` (a roof or wall in full sun above the material's heat-deflection temperature, blocker
 * `outdoor_unacknowledged`); cautions are listed and may be acknowledged.
 */
export const FamilyGateSchema = z.object({
  ok: z.boolean(),
  blockers: z.array(GateBlockerSchema),
  warnings: z.array(GateWarningSchema),
});
/** The family gate (see {@link FamilyGateSchema}). */
export type FamilyGate = z.infer<typeof FamilyGateSchema>;

/** A reviewer's comment, kept with the revision. */
export const ReviewCommentSchema = z.object({
  action: FamilyActionSchema,
  text: z.string(),
  by: ActorSchema,
  at: z.string(),
});
/** A review comment (see {@link ReviewCommentSchema}). */
export type ReviewComment = z.infer<typeof ReviewCommentSchema>;

/** A photo of a printed sample. */
export const PhotoSchema = z.object({
  id: z.string(),
  familyId: z.string(),
  caption: z.string(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  /** Content type detected on upload (image/jpeg, image/png, image/webp). */
  originalType: z.string(),
  uploadedBy: ActorSchema,
  createdAt: z.string(),
  /** `/api/photos/<id>` */
  url: z.string(),
  /** `/api/photos/<id>/thumb` */
  thumbUrl: z.string(),
});
/** A photo (see {@link PhotoSchema}). */
export type Photo = z.infer<typeof PhotoSchema>;

/** Answer of `POST /api/families/:id/photos`. */
export const PhotoResponseSchema = z.object({ photo: PhotoSchema });
/** Answer of `POST /api/families/:id/photos`. */
export type PhotoResponse = z.infer<typeof PhotoResponseSchema>;

/** One revision in the family's history. */
export const RevisionSummarySchema = z.object({
  number: z.number().int(),
  state: FamilyStateSchema,
  createdAt: z.string(),
  publishedAt: z.string().nullable(),
});
/** A revision summary (see {@link RevisionSummarySchema}). */
export type RevisionSummary = z.infer<typeof RevisionSummarySchema>;

/** A family as the API shows it: its current (newest) revision's content and state, plus workflow data. */
export const FamilySchema = FamilySpecSchema.extend({
  id: z.string(),
  code: z.string(),
  templateVersion: z.number().int(),
  owner: ActorSchema,
  /** State of the current revision. */
  state: FamilyStateSchema,
  /** Number of the current (newest) revision. */
  revision: z.number().int(),
  /** Number of the revision in the catalogue, or null. */
  publishedRevision: z.number().int().nullable(),
  /** Optimistic lock of the current revision: bumps on every change. */
  lock: z.number().int(),
  /** Variants in the matrix of the current revision. */
  variantCount: z.number().int(),
  compute: ComputeStatusSchema,
  gate: FamilyGateSchema,
  acknowledgements: z.array(AcknowledgementSchema),
  comments: z.array(ReviewCommentSchema),
  revisions: z.array(RevisionSummarySchema),
  photos: z.array(PhotoSchema),
  /** Workflow actions the signed-in person may take now. */
  allowedActions: z.array(FamilyActionSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
});
/** A family (see {@link FamilySchema}). */
export type Family = z.infer<typeof FamilySchema>;

/** Answer of the single-family routes. */
export const FamilyResponseSchema = z.object({ family: FamilySchema });
/** Answer of the single-family routes. */
export type FamilyResponse = z.infer<typeof FamilyResponseSchema>;

/** A family in lists. */
export const FamilySummarySchema = FamilySchema.pick({
  id: true,
  code: true,
  name: true,
  templateId: true,
  templateVersion: true,
  owner: true,
  state: true,
  revision: true,
  publishedRevision: true,
  variantCount: true,
  updatedAt: true,
}).extend({ computeState: ComputeStateSchema, gateOk: z.boolean() });
/** A family in lists (see {@link FamilySummarySchema}). */
export type FamilySummary = z.infer<typeof FamilySummarySchema>;

/** Query of `GET /api/families`. */
export const FamilyListQuerySchema = z.object({
  state: FamilyStateSchema.optional(),
  q: z.string().max(80).optional(),
});
/** Query of `GET /api/families`. */
export type FamilyListQuery = z.infer<typeof FamilyListQuerySchema>;

/** Answer of `GET /api/families`. */
export const FamilyListResponseSchema = z.object({ families: z.array(FamilySummarySchema) });
/** Answer of `GET /api/families`. */
export type FamilyListResponse = z.infer<typeof FamilyListResponseSchema>;

/** Optional guard every transition body may carry. */
export const TransitionGuardSchema = z.object({
  /** Act only if the current revision still has this number. */
  expectedRevision: z.number().int().positive().optional(),
  /** Act only if the current revision's lock is still this value. */
  expectedLock: z.number().int().nonnegative().optional(),
});

/** Body of submit, publish and retire. */
export const TransitionSchema = TransitionGuardSchema.strict();
/** Body of submit, publish and retire. */
export type Transition = z.infer<typeof TransitionSchema>;

/** Body of `POST /api/families/:id/approve`. */
export const ReviewDecisionSchema = TransitionGuardSchema.extend({ comment: z.string().trim().max(2000).optional() });
/** Body of `POST /api/families/:id/approve`. */
export type ReviewDecision = z.infer<typeof ReviewDecisionSchema>;

/** Body of `POST /api/families/:id/return`: comments are required. */
export const ReturnDecisionSchema = TransitionGuardSchema.extend({
  comments: z.string().trim().min(1, 'comments are required').max(2000),
});
/** Body of `POST /api/families/:id/return`. */
export type ReturnDecision = z.infer<typeof ReturnDecisionSchema>;

/** Query of `GET /api/families/:id/diff` (revision numbers). */
export const RevisionDiffQuerySchema = z.object({
  from: z.coerce.number().int().positive(),
  to: z.coerce.number().int().positive(),
});

/** A changed field between two revisions. */
export const FieldChangeSchema = z.object({
  /** e.g. `baseParams.wallThicknessMm`, `supportBudgetMm3`, `templateVersion`. */
  field: z.string(),
  from: z.unknown(),
  to: z.unknown(),
});

/** How one axis changed between two revisions. */
export const AxisChangeSchema = z.object({
  key: z.string(),
  kind: z.enum(['param', 'attribute']),
  change: z.enum(['added', 'removed', 'changed', 'same']),
  addedValues: z.array(AxisValueSchema),
  removedValues: z.array(AxisValueSchema),
});

/** Answer of `GET /api/families/:id/diff`. */
export const RevisionDiffSchema = z.object({
  from: z.number().int(),
  to: z.number().int(),
  /** Changes of base parameters and other spec fields. */
  fields: z.array(FieldChangeSchema),
  axes: z.array(AxisChangeSchema),
  variantCount: z.object({ from: z.number().int(), to: z.number().int() }),
});
/** Answer of `GET /api/families/:id/diff`. */
export type RevisionDiff = z.infer<typeof RevisionDiffSchema>;

/** One audit event about a family. */
export const FamilyAuditEventSchema = z.object({
  id: z.number().int(),
  /** e.g. `family.created`, `family.submitted`, `family.returned`, `family.photo_added`. */
  action: z.string(),
  actor: ActorSchema.nullable(),
  at: z.string(),
  details: z.record(z.string(), z.unknown()),
});
/** One audit event (see {@link FamilyAuditEventSchema}). */
export type FamilyAuditEvent = z.infer<typeof FamilyAuditEventSchema>;

/** Answer of `GET /api/families/:id/audit` (newest first). */
export const AuditListResponseSchema = z.object({ events: z.array(FamilyAuditEventSchema) });
/** Answer of `GET /api/families/:id/audit`. */
export type AuditListResponse = z.infer<typeof AuditListResponseSchema>;

/** A published variant with everything a spec sheet, price list or quote needs (bird-facing facts in `report.facts`). */
export const CatalogueVariantSchema = VariantSchema.pick({
  sku: true,
  variantKey: true,
  axisValues: true,
  params: true,
  attributes: true,
  sha256: true,
  verdict: true,
  birdFitWarnings: true,
}).extend({
  family: z.object({ id: z.string(), code: z.string(), name: z.string(), description: z.string() }),
  revision: z.number().int(),
  templateId: z.string(),
  templateVersion: z.number().int(),
  report: VariantReportSchema,
  cost: VariantCostSchema,
  /** Suggested unit price in cents (the cost's suggested price). */
  priceCents: z.number().int(),
  currency: z.string(),
  acknowledgements: z.array(AcknowledgementSchema),
  photos: z.array(PhotoSchema),
  publishedAt: z.string(),
});
/** A published variant (see {@link CatalogueVariantSchema}). */
export type CatalogueVariant = z.infer<typeof CatalogueVariantSchema>;

/** Query of `GET /api/catalogue`. */
export const CatalogueQuerySchema = z.object({
  /** Substring of SKU or family name (case-insensitive). */
  q: z.string().max(80).optional(),
  familyId: z.string().optional(),
  colour: z.string().optional(),
  material: z.string().optional(),
});
/** Query of `GET /api/catalogue`. */
export type CatalogueQuery = z.infer<typeof CatalogueQuerySchema>;

/** Answer of `GET /api/catalogue`. */
export const CatalogueResponseSchema = z.object({ variants: z.array(CatalogueVariantSchema) });
/** Answer of `GET /api/catalogue`. */
export type CatalogueResponse = z.infer<typeof CatalogueResponseSchema>;

/** A message the fake SMTP server captured. */
export const MailMessageSchema = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  receivedAt: z.string(),
});
/** A captured message (see {@link MailMessageSchema}). */
export type MailMessage = z.infer<typeof MailMessageSchema>;

/** A queued outgoing message. */
export const OutboxEntrySchema = z.object({
  id: z.number().int(),
  to: z.array(z.string()),
  subject: z.string(),
  status: z.enum(['pending', 'sent', 'failed']),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
});
/** An outbox entry (see {@link OutboxEntrySchema}). */
export type OutboxEntry = z.infer<typeof OutboxEntrySchema>;

/** Answer of `GET /api/mail/messages` (newest first). */
export const MailMessagesResponseSchema = z.object({
  messages: z.array(MailMessageSchema),
  outbox: z.array(OutboxEntrySchema),
});
/** Answer of `GET /api/mail/messages`. */
export type MailMessagesResponse = z.infer<typeof MailMessagesResponseSchema>;
