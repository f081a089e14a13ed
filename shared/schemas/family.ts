/**
 * Variant families, review and publishing: the family as the API shows it and the list of family routes. The shapes live in one module per concern: familySpec (states, axes, the edited spec), variant (compute,
 * reports, the variant list), gate, review (transitions, diff, audit), photo, catalogue and mail. These modules are
 * the contract the screens are built against: add fields, never rename.
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
 * Photo, catalogue and mail routes are listed in photo.ts, catalogue.ts and mail.ts; the SKU scheme in familySpec.ts.
 */
import { z } from 'zod';
import { AcknowledgementSchema, FamilyGateSchema } from './gate';
import { ActorSchema, ReviewCommentSchema } from './review';
import { PhotoSchema } from './photo';
import { ComputeStateSchema, ComputeStatusSchema } from './variant';
import { FamilyActionSchema, FamilySpecSchema, FamilyStateSchema } from './familySpec';

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
