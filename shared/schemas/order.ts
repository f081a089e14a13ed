/** Orders of the shop: states, the allowed transitions, and the order as the API shows it. */
import { z } from 'zod';
import { OrderFulfilmentSchema } from './fulfilment';
import { ShipToSchema } from './shop';

/** Every state an order can be in. */
export const ORDER_STATES = [
  'placed',
  'paid',
  'in_production',
  'shipped',
  'delivered',
  'cancelled',
  'refunded',
] as const;
/** An order state. */
export const OrderStateSchema = z.enum(ORDER_STATES);
/** An order state (see {@link OrderStateSchema}). */
export type OrderState = z.infer<typeof OrderStateSchema>;

/** Words for the states, for people. */
export const ORDER_STATE_LABELS: Record<OrderState, string> = {
  placed: 'Awaiting payment',
  paid: 'Paid',
  in_production: 'In production',
  shipped: 'Shipped',
  delivered: 'Delivered',
  cancelled: 'Cancelled',
  refunded: 'Refunded',
};

/**
 * Where each state may go. An unpaid order is cancelled (by operations or when its checkout expires); a paid order
 * is never just cancelled: it is refunded, which also ends it.
 */
export const ORDER_TRANSITIONS: Record<OrderState, readonly OrderState[]> = {
  placed: ['paid', 'cancelled'],
  paid: ['in_production', 'refunded'],
  in_production: ['shipped', 'refunded'],
  shipped: ['delivered', 'refunded'],
  delivered: ['refunded'],
  cancelled: [],
  refunded: [],
};

/**
 * True when an order in state `from` may move to `to`.
 * @param from - the current state
 * @param to - the wanted state
 */
export function canTransition(from: OrderState, to: OrderState): boolean {
  return ORDER_TRANSITIONS[from].includes(to);
}

/** Something about a payment that needs a person: the order is not fulfilled until it is cleared. */
export const PaymentFlagSchema = z.enum(['amount_mismatch', 'currency_mismatch']);
/** A payment flag (see {@link PaymentFlagSchema}). */
export type PaymentFlag = z.infer<typeof PaymentFlagSchema>;

/** One line of an order, frozen when it was placed. */
export const OrderLineSchema = z.object({
  sku: z.string(),
  productName: z.string(),
  /** Content hash of the mesh sold (the farm prints exactly this). */
  meshSha256: z.string(),
  quantity: z.number().int().positive(),
  /** Unit price charged, VAT included, in minor units. */
  unitPriceMinor: z.number().int().nonnegative(),
  lineTotalMinor: z.number().int().nonnegative(),
});
/** An order line (see {@link OrderLineSchema}). */
export type OrderLine = z.infer<typeof OrderLineSchema>;

/** The payment side of an order. */
export const OrderPaymentSchema = z.object({
  /** The provider's checkout session. */
  sessionId: z.string().nullable(),
  /** The provider's payment (set once paid). */
  paymentIntentId: z.string().nullable(),
  /** What the provider says was paid, minor units. */
  paidMinor: z.number().int().nullable(),
  paidAt: z.string().nullable(),
  flag: PaymentFlagSchema.nullable(),
  refundId: z.string().nullable(),
  refundedMinor: z.number().int().nullable(),
});
/** The payment side of an order (see {@link OrderPaymentSchema}). */
export type OrderPayment = z.infer<typeof OrderPaymentSchema>;

/** One entry of an order's history. */
export const OrderHistoryEntrySchema = z.object({
  at: z.string(),
  action: z.string(),
  /** Who did it; null for the customer, the payment provider or the system. */
  actor: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
});
/** A history entry (see {@link OrderHistoryEntrySchema}). */
export type OrderHistoryEntry = z.infer<typeof OrderHistoryEntrySchema>;

/** An order as operations see it. */
export const OrderSchema = z.object({
  id: z.string(),
  /** Human-friendly order number, e.g. `NW-1042`. */
  number: z.string(),
  state: OrderStateSchema,
  email: z.string(),
  shipTo: ShipToSchema,
  currency: z.string(),
  lines: z.array(OrderLineSchema),
  subtotalMinor: z.number().int(),
  shippingMinor: z.number().int(),
  vatMinor: z.number().int(),
  vatRatePct: z.number(),
  totalMinor: z.number().int(),
  payment: OrderPaymentSchema,
  trackingUrl: z.string().nullable(),
  /** When an unpaid order expires. */
  expiresAt: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
/** An order (see {@link OrderSchema}). */
export type Order = z.infer<typeof OrderSchema>;

/** Answer of `GET /api/orders/:id`: the order and its history. */
export const OrderDetailSchema = OrderSchema.extend({
  history: z.array(OrderHistoryEntrySchema),
  /** The farm side: dispatches with the farm's state, carrier and tracking number, reprints and their cost. */
  fulfilment: OrderFulfilmentSchema,
});
/** Answer of `GET /api/orders/:id`. */
export type OrderDetail = z.infer<typeof OrderDetailSchema>;

/** What the customer's private order page shows (no internal ids or payment references). */
export const CustomerOrderSchema = OrderSchema.pick({
  number: true,
  state: true,
  shipTo: true,
  currency: true,
  lines: true,
  subtotalMinor: true,
  shippingMinor: true,
  vatMinor: true,
  vatRatePct: true,
  totalMinor: true,
  trackingUrl: true,
  createdAt: true,
}).extend({ paid: z.boolean() });
/** The customer's view of an order. */
export type CustomerOrder = z.infer<typeof CustomerOrderSchema>;

/** Query of `GET /api/orders`. */
export const OrderListQuerySchema = z.object({
  state: OrderStateSchema.optional(),
  /** Order number, e-mail, name or SKU (part of it, any case). */
  q: z.string().trim().max(80).optional(),
  flagged: z.enum(['true', 'false']).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
/** Query of `GET /api/orders`. */
export type OrderListQuery = z.infer<typeof OrderListQuerySchema>;

/** Answer of `GET /api/orders`. */
export const OrderListResponseSchema = z.object({
  orders: z.array(OrderSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
/** Answer of `GET /api/orders`. */
export type OrderListResponse = z.infer<typeof OrderListResponseSchema>;

/** Body of `POST /api/orders/:id/transition` (operations moving an order along). */
export const OrderTransitionRequestSchema = z.object({
  to: z.enum(['in_production', 'shipped', 'delivered']),
  /** Required when `to` is `shipped`: the carrier's tracking page for this parcel. */
  trackingUrl: z
    .url({ protocol: /^https?$/, message: 'tracking link must be a web address' })
    .max(500)
    .optional(),
  note: z.string().trim().max(500).optional(),
});
/** Body of `POST /api/orders/:id/transition`. */
export type OrderTransitionRequest = z.infer<typeof OrderTransitionRequestSchema>;

/** Body of `POST /api/orders/:id/cancel`: cancels an unpaid order, or refunds a paid one in full. */
export const OrderCancelRequestSchema = z.object({
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(500),
});
/** Body of `POST /api/orders/:id/cancel`. */
export type OrderCancelRequest = z.infer<typeof OrderCancelRequestSchema>;

/** Body of `POST /api/orders/:id/clear-flag`: what the person checked with the payment service. */
export const OrderClearFlagRequestSchema = z.object({
  note: z.string().trim().min(3, 'say what you checked with the payment service').max(500),
});
/** Body of `POST /api/orders/:id/clear-flag`. */
export type OrderClearFlagRequest = z.infer<typeof OrderClearFlagRequestSchema>;

/** Route parameter `:id` of an order. */
export const OrderIdParamsSchema = z.object({ id: z.uuid('no such order') });
/** Route parameter `:token` of the customer's order page. */
export const OrderTokenParamsSchema = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{32,64}$/) });

/**
 * The order number people read, from its running number.
 * @param seq - the running number (starts at 1001)
 */
export function formatOrderNumber(seq: number): string {
  return `NW-${seq}`;
}
