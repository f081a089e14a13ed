/** Fulfilment as the studio sees it: dispatches to the farm, the exceptions queue, demand and run requests. */
import { z } from 'zod';
import { HoldCodeSchema, WorkOrderStageSchema } from './farm';
import { PlanItemSchema, RunPlanSchema } from './plan';

/**
 * Where our side of a dispatch is: `queued` (written with the payment, not yet sent), `waiting` (the farm could not
 * be reached; tried again later), `at_farm`, `held` (the farm needs a decision: exceptions queue), `done` (handed to
 * the carrier) or `withdrawn` (replaced by a re-dispatch, or cancelled).
 */
export const DISPATCH_STATUSES = ['queued', 'waiting', 'at_farm', 'held', 'done', 'withdrawn'] as const;
/** A dispatch status. */
export const DispatchStatusSchema = z.enum(DISPATCH_STATUSES);
/** A dispatch status (see {@link DispatchStatusSchema}). */
export type DispatchStatus = z.infer<typeof DispatchStatusSchema>;

/** Words for the statuses and the farm's stages, for people. */
export const DISPATCH_STATUS_LABELS: Record<DispatchStatus, string> = {
  queued: 'Queued for the farm',
  waiting: 'Waiting for the farm',
  at_farm: 'At the farm',
  held: 'Held by the farm',
  done: 'Handed to the carrier',
  withdrawn: 'Withdrawn',
};

/** Words for the farm's stages. */
export const FARM_STAGE_LABELS: Record<z.infer<typeof WorkOrderStageSchema>, string> = {
  accepted: 'Accepted',
  scheduled: 'Scheduled',
  printing: 'Printing',
  packing: 'Packing',
  handed_over: 'Handed to the carrier',
  on_hold: 'On hold',
  withdrawn: 'Withdrawn',
};

/** Words for hold reasons. */
export const HOLD_LABELS: Record<z.infer<typeof HoldCodeSchema>, string> = {
  address_undeliverable: 'Address rejected by the carrier',
  colour_unavailable: 'Colour out of stock at the farm',
};

/** One dispatch of an order (or a run) to the farm. */
export const DispatchSchema = z.object({
  id: z.number().int(),
  orderId: z.string().nullable(),
  runId: z.string().nullable(),
  attempt: z.number().int(),
  status: DispatchStatusSchema,
  failures: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  farmWorkOrderId: z.string().nullable(),
  farmStage: WorkOrderStageSchema.nullable(),
  holdCode: HoldCodeSchema.nullable(),
  holdMessage: z.string().nullable(),
  carrier: z.string().nullable(),
  trackingCode: z.string().nullable(),
  trackingUrl: z.string().nullable(),
  reprints: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
/** A dispatch (see {@link DispatchSchema}). */
export type Dispatch = z.infer<typeof DispatchSchema>;

/** The farm side of an order in `GET /api/orders/:id`: every dispatch, the newest first, and the cost of reprints. */
export const OrderFulfilmentSchema = z.object({
  dispatches: z.array(DispatchSchema),
  /** Plates printed again over all dispatches. */
  reprints: z.number().int(),
  /** The engine's cost of the units printed again (material, machine time, energy), minor units. */
  reprintCostMinor: z.number().int(),
});
/** The farm side of an order (see {@link OrderFulfilmentSchema}). */
export type OrderFulfilment = z.infer<typeof OrderFulfilmentSchema>;

/** One entry of the exceptions queue: a held dispatch with its order. */
export const FarmExceptionSchema = DispatchSchema.extend({
  orderNumber: z.string().nullable(),
  email: z.string().nullable(),
  shipTo: z.record(z.string(), z.string()).nullable(),
});
/** An exception (see {@link FarmExceptionSchema}). */
export type FarmException = z.infer<typeof FarmExceptionSchema>;

/** Answer of `GET /api/farm/exceptions`: held dispatches, and those waiting for an unreachable farm. */
export const FarmExceptionsResponseSchema = z.object({
  held: z.array(FarmExceptionSchema),
  waiting: z.array(FarmExceptionSchema),
});
/** Answer of `GET /api/farm/exceptions`. */
export type FarmExceptionsResponse = z.infer<typeof FarmExceptionsResponseSchema>;

/** Route parameter `:id` of a dispatch. */
export const DispatchIdParamsSchema = z.object({ id: z.coerce.number().int().positive('No such dispatch.') });

/** Body of `POST /api/farm/dispatches/:id/redispatch`: send again, with a corrected address when given. */
export const RedispatchRequestSchema = z.object({
  shipTo: z
    .object({
      name: z.string().trim().min(1, 'Enter the name to ship to.').max(120),
      line1: z.string().trim().min(1, 'Enter the first line of the address.').max(120),
      line2: z.string().trim().max(120).default(''),
      city: z.string().trim().min(1, 'Enter the town or city.').max(80),
      region: z.string().trim().max(80).default(''),
      postalCode: z
        .string()
        .trim()
        .min(1, 'Enter the postcode.')
        .max(16)
        .regex(/^[A-Za-z0-9][A-Za-z0-9 -]{0,15}$/, 'postcode has characters a postcode never has'),
      country: z.string().trim().toUpperCase().length(2, 'country must be chosen from the list'),
    })
    .optional(),
  note: z.string().trim().max(500).optional(),
});
/** Body of `POST /api/farm/dispatches/:id/redispatch`. */
export type RedispatchRequest = z.infer<typeof RedispatchRequestSchema>;

/** Body of `POST /api/farm/dispatches/:id/cancel`: withdraw at the farm and refund the order. */
export const CancelDispatchRequestSchema = z.object({
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(500),
});

/** Query of `GET /api/farm/demand`. */
export const DemandQuerySchema = z.object({
  weeks: z.coerce.number().int().min(1, 'weeks must be at least 1').max(104, 'weeks is at most 104').default(12),
});

/** Paid units of one variant in one ISO week. */
export const DemandWeekSchema = z.object({ week: z.string(), units: z.number().int() });

/** One variant's demand and unit costs. */
export const DemandVariantSchema = z.object({
  sku: z.string(),
  label: z.string(),
  colourId: z.string(),
  weeks: z.array(DemandWeekSchema),
  totalUnits: z.number().int(),
  /** Cost of one unit printed on demand, and in a run of the last period's demand. */
  onDemandUnitCents: z.number().int().nullable(),
  runUnitCents: z.number().int().nullable(),
  /** Plates printed again per unit shipped, as the farm reported them. */
  reprintsPerUnit: z.number(),
});
/** A variant's demand (see {@link DemandVariantSchema}). */
export type DemandVariant = z.infer<typeof DemandVariantSchema>;

/** Answer of `GET /api/farm/demand`. */
export const DemandResponseSchema = z.object({
  /** ISO weeks shown, oldest first, e.g. `2026-W09`. */
  weeks: z.array(z.string()),
  variants: z.array(DemandVariantSchema),
  currency: z.string(),
  /** Why some figures are missing (variants no longer published, sizes not yet measured). */
  notes: z.array(z.string()),
});
/** Answer of `GET /api/farm/demand`. */
export type DemandResponse = z.infer<typeof DemandResponseSchema>;

/** Body of `POST /api/farm/plans`: variants and quantities, the printer, and the dates. */
export const PlanRequestSchema = z.object({
  items: z
    .array(
      z.object({
        sku: z.string().trim().min(1, 'Enter a SKU.'),
        quantity: z.coerce
          .number('quantity must be a number')
          .int('quantity must be a whole number')
          .min(1, 'quantity must be at least 1')
          .max(10_000, 'quantity is at most 10,000'),
      }),
    )
    .min(1, 'choose at least one variant')
    .max(200, 'at most 200 variants in one run'),
  printerId: z.string().min(1, 'choose a printer'),
  startDate: z.iso.date('start date must be a date'),
  finishBy: z.iso.date('finish date must be a date'),
  hoursPerDay: z.coerce.number().gt(0, 'hours per day must be above 0').max(24, 'a day has 24 hours').default(22),
});
/** Body of `POST /api/farm/plans`. */
export type PlanRequest = z.infer<typeof PlanRequestSchema>;

/** Answer of `POST /api/farm/plans`: the plan and what it was made from. */
export const PlanResponseSchema = z.object({
  plan: RunPlanSchema,
  items: z.array(PlanItemSchema),
  printer: z.object({ id: z.string(), name: z.string(), buildVolumeMm: z.tuple([z.number(), z.number(), z.number()]) }),
});
/** Answer of `POST /api/farm/plans`. */
export type PlanResponse = z.infer<typeof PlanResponseSchema>;

/** A run sent to the farm. */
export const FarmRunSchema = z.object({
  id: z.string(),
  name: z.string(),
  units: z.number().int(),
  plates: z.number().int(),
  createdAt: z.string(),
  dispatch: DispatchSchema.nullable(),
});
/** A run (see {@link FarmRunSchema}). */
export type FarmRun = z.infer<typeof FarmRunSchema>;

/** Answer of `GET /api/farm/runs`. */
export const FarmRunListSchema = z.object({ runs: z.array(FarmRunSchema) });

/** A published variant a run can print (answer of `GET /api/farm/variants`). */
export const PlannableVariantSchema = z.object({
  sku: z.string(),
  label: z.string(),
  materialId: z.string(),
  colourId: z.string(),
  priceCents: z.number().int(),
  costCents: z.number().int(),
  currency: z.string(),
});
/** A plannable variant (see {@link PlannableVariantSchema}). */
export type PlannableVariant = z.infer<typeof PlannableVariantSchema>;

/** Answer of `GET /api/farm/variants`. */
export const PlannableVariantListSchema = z.object({ variants: z.array(PlannableVariantSchema) });
