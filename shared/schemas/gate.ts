/**
 * The family gate: what blocks a submit and which bird-fit or outdoor warnings must be acknowledged in writing.
 *
 * Route: `POST /api/families/:id/acknowledgements` body {@link AcknowledgementsCreate}; `POST /api/families/:id/submit`
 * answers 409 `gate_failed` with `details` = {@link FamilyGate} when the gate blocks.
 */
import { z } from 'zod';
import { BirdFitSeveritySchema, BirdFitWarningSchema } from './birdfit';
import { ActorSchema } from './review';

/** Shortest acknowledgement text a designer must write for a bird-fit warning. */
export const ACK_MIN_CHARS = 10;

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
        text: z
          .string()
          .trim()
          .min(ACK_MIN_CHARS, `Write at least ${ACK_MIN_CHARS} characters on why the warning is acceptable.`)
          .max(2000),
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
  'over_target',
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
