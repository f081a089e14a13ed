/**
 * The print-farm protocol (version 1) that our farm client speaks and our local fake farm answers. Names, stages and
 * resources are our own design:
 *
 * - `PUT  /v1/print-files/:meshSha256`  a print file (binary STL or 3MF), stored once per mesh hash
 * - `GET  /v1/print-files/:meshSha256`  whether the farm has it
 * - `POST /v1/work-orders`               a work order: lines (file, material, colour, quantity) and a ship-to;
 *                                         needs an `Idempotency-Key` header
 * - `GET  /v1/work-orders/:id`           its stage, parcel and log
 * - `POST /v1/work-orders/:id/withdraw`  withdraws it before printing starts
 * - notices: the farm POSTs a {@link FarmNotice} to the studio's notice address, signed (see farmSignature.ts)
 *
 * Every call carries `Authorization: Bearer <key>`; errors answer `{ error: { code, message } }`.
 */
import { z } from 'zod';

/** Where a work order is at the farm: accepted → scheduled → printing → packing → handed_over (to the carrier). */
export const WORK_ORDER_STAGES = [
  'accepted',
  'scheduled',
  'printing',
  'packing',
  'handed_over',
  'on_hold',
  'withdrawn',
] as const;
/** A work-order stage. */
export const WorkOrderStageSchema = z.enum(WORK_ORDER_STAGES);
/** A work-order stage (see {@link WorkOrderStageSchema}). */
export type WorkOrderStage = z.infer<typeof WorkOrderStageSchema>;

/** Why the farm holds a work order until the studio acts. */
export const HoldCodeSchema = z.enum(['address_undeliverable', 'colour_unavailable']);
/** A hold code (see {@link HoldCodeSchema}). */
export type HoldCode = z.infer<typeof HoldCodeSchema>;

/** A postal address for the parcel. */
export const FarmAddressSchema = z.object({
  name: z.string().min(1).max(120),
  line1: z.string().min(1).max(120),
  line2: z.string().max(120).default(''),
  city: z.string().min(1).max(80),
  region: z.string().max(80).default(''),
  postalCode: z.string().min(1).max(16),
  /** ISO 3166-1 alpha-2. */
  country: z.string().length(2),
});
/** A farm address (see {@link FarmAddressSchema}). */
export type FarmAddress = z.infer<typeof FarmAddressSchema>;

/** One line of a work order as the studio sends it. */
export const WorkOrderLineInputSchema = z.object({
  /** The studio's own reference of the line (its SKU). */
  lineRef: z.string().min(1).max(80),
  meshSha256: z.string().regex(/^[0-9a-f]{64}$/),
  material: z.string().min(1).max(40),
  colour: z.string().min(1).max(40),
  quantity: z.number().int().min(1).max(100_000),
});
/** A work-order line as sent (see {@link WorkOrderLineInputSchema}). */
export type WorkOrderLineInput = z.infer<typeof WorkOrderLineInputSchema>;

/** Body of `POST /v1/work-orders`. */
export const WorkOrderInputSchema = z.object({
  /** The studio's reference (order number or run name). */
  reference: z.string().min(1).max(80),
  /** `single`: one customer's parcel; `run`: a planned batch delivered to the studio. */
  kind: z.enum(['single', 'run']),
  lines: z.array(WorkOrderLineInputSchema).min(1).max(200),
  shipTo: FarmAddressSchema,
});
/** Body of `POST /v1/work-orders`. */
export type WorkOrderInput = z.infer<typeof WorkOrderInputSchema>;

/** A work order as the farm reports it. */
export const WorkOrderSchema = z.object({
  /** The farm's id, e.g. `wo_8f3k2`. */
  id: z.string(),
  reference: z.string(),
  kind: z.enum(['single', 'run']),
  stage: WorkOrderStageSchema,
  stageChangedAt: z.string(),
  hold: z.object({ code: HoldCodeSchema, message: z.string() }).nullable(),
  lines: z.array(
    WorkOrderLineInputSchema.extend({
      /** Good units printed so far. */
      printed: z.number().int(),
      /** Plates of this line that failed and were printed again. */
      reprints: z.number().int(),
    }),
  ),
  shipTo: FarmAddressSchema,
  /** Set once handed to the carrier. */
  parcel: z.object({ carrier: z.string(), trackingCode: z.string(), trackingUrl: z.string() }).nullable(),
  log: z.array(z.object({ at: z.string(), stage: WorkOrderStageSchema, note: z.string() })),
  createdAt: z.string(),
});
/** A work order (see {@link WorkOrderSchema}). */
export type WorkOrder = z.infer<typeof WorkOrderSchema>;

/** What a print file upload answers. */
export const PrintFileSchema = z.object({
  meshSha256: z.string(),
  format: z.enum(['stl', '3mf']),
  bytes: z.number().int(),
  receivedAt: z.string(),
});
/** A stored print file (see {@link PrintFileSchema}). */
export type PrintFile = z.infer<typeof PrintFileSchema>;

/** A notice the farm sends when a work order moves: a new stage, a reprint, a hold. */
export const FarmNoticeSchema = z.object({
  /** Unique per notice: a repeated delivery carries the same id. */
  noticeId: z.string().min(1).max(100),
  kind: z.enum(['stage_changed', 'reprint', 'hold']),
  occurredAt: z.string(),
  workOrder: WorkOrderSchema,
});
/** A farm notice (see {@link FarmNoticeSchema}). */
export type FarmNotice = z.infer<typeof FarmNoticeSchema>;

/** Faults the local fake farm can be told to inject (`POST /v1/test-faults`); every field optional. */
export const FarmFaultsSchema = z.object({
  /** Answer every API call with 503 and hold back notices. */
  down: z.boolean().optional(),
  /** Hold work orders whose ship-to postcode or first line contains this text (case-insensitive). */
  rejectAddressesMatching: z.string().max(80).nullable().optional(),
  /** Material/colour pairs out of stock: work orders that need them are held. */
  outOfStock: z.array(z.object({ material: z.string(), colour: z.string() })).optional(),
  /** The next this-many plates fail and are printed again. */
  failPrints: z.number().int().min(0).max(100).optional(),
  /** The next this-many notices are never delivered. */
  loseNotices: z.number().int().min(0).max(1000).optional(),
  /** The next this-many API calls answer 429 with Retry-After: 1. */
  throttle: z.number().int().min(0).max(100).optional(),
});
/** Faults to inject (see {@link FarmFaultsSchema}). */
export type FarmFaults = z.infer<typeof FarmFaultsSchema>;
