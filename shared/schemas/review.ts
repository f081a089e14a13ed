/**
 * Review of a family: who acted, reviewers' comments, the bodies of the workflow transitions (submit, approve,
 * return, publish, retire), the diff between two revisions and the family's audit trail.
 *
 * State changes the state does not allow -> 409 `invalid_state` naming the state; a lost race -> 409
 * `state_changed`. Every transition body may carry `expectedRevision` / `expectedLock` to act on what was seen.
 */
import { z } from 'zod';
import { AxisValueSchema, FamilyActionSchema } from './familySpec';

/** A person as the workflow shows them. */
export const ActorSchema = z.object({ id: z.string(), name: z.string() });
/** A person as the workflow shows them. */
export type Actor = z.infer<typeof ActorSchema>;

/** A reviewer's comment, kept with the revision. */
export const ReviewCommentSchema = z.object({
  action: FamilyActionSchema,
  text: z.string(),
  by: ActorSchema,
  at: z.string(),
});
/** A review comment (see {@link ReviewCommentSchema}). */
export type ReviewComment = z.infer<typeof ReviewCommentSchema>;

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

/** A note with a workflow step, kept with the revision, in the family's history and in the e-mail. */
export const StepNoteSchema = z.string().trim().max(2000, 'A note can be at most 2,000 characters long.');

/**
 * Body of `POST /api/families/:id/approve`, `/submit`, `/publish` and `/retire`: an optional note (an empty one is
 * the same as none).
 */
export const ReviewDecisionSchema = TransitionGuardSchema.extend({ comment: StepNoteSchema.optional() });
/** Body of approve, submit, publish and retire. */
export type ReviewDecision = z.infer<typeof ReviewDecisionSchema>;

/** Body of `POST /api/families/:id/return`: comments are required. */
export const ReturnDecisionSchema = TransitionGuardSchema.extend({
  comments: StepNoteSchema.min(1, 'Say what should change before the family can be approved.'),
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
