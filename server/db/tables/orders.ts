/** Tables of the shop: orders, their lines, and the payment provider's events (kept by id so a replay applies once). */
import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, serial, text, timestamp, doublePrecision } from 'drizzle-orm/pg-core';
import type { OrderState, PaymentFlag } from '../../../shared/schemas/order';
import type { ShipTo } from '../../../shared/schemas/shop';

/**
 * A customer's order. `customerToken` is the secret in the customer's private link (32 random bytes); `number` is
 * the running number behind `NW-1001`. History lives in audit_events under `order:<id>`.
 */
export const orders = pgTable(
  'orders',
  {
    id: text('id').primaryKey(),
    number: integer('number').generatedAlwaysAsIdentity({ startWith: 1001 }).notNull().unique(),
    customerToken: text('customer_token').notNull().unique(),
    state: text('state').$type<OrderState>().notNull().default('placed'),
    email: text('email').notNull(),
    shipTo: jsonb('ship_to').$type<ShipTo>().notNull(),
    currency: text('currency').notNull(),
    subtotalMinor: integer('subtotal_minor').notNull(),
    shippingMinor: integer('shipping_minor').notNull(),
    vatMinor: integer('vat_minor').notNull(),
    vatRatePct: doublePrecision('vat_rate_pct').notNull(),
    totalMinor: integer('total_minor').notNull(),
    /** The provider's checkout session id. */
    paymentSessionId: text('payment_session_id').unique(),
    paymentIntentId: text('payment_intent_id'),
    paidMinor: integer('paid_minor'),
    paidAt: timestamp('paid_at', { withTimezone: true }),
    paymentFlag: text('payment_flag').$type<PaymentFlag>(),
    refundId: text('refund_id'),
    refundedMinor: integer('refunded_minor'),
    trackingUrl: text('tracking_url'),
    /** The shop's address when the order was placed: links in the customer's mails point there. */
    siteOrigin: text('site_origin').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('orders_state_idx').on(table.state),
    index('orders_created_at_idx').on(table.createdAt),
    check(
      'orders_state_known',
      sql`${table.state} in ('placed','paid','in_production','shipped','delivered','cancelled','refunded')`,
    ),
    check('orders_total_nonnegative', sql`${table.totalMinor} >= 0`),
  ],
);

/** One line of an order, frozen at checkout: SKU, mesh hash, quantity and unit price in minor units. */
export const orderLines = pgTable(
  'order_lines',
  {
    id: serial('id').primaryKey(),
    orderId: text('order_id')
      .notNull()
      .references(() => orders.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    sku: text('sku').notNull(),
    productName: text('product_name').notNull(),
    meshSha256: text('mesh_sha256').notNull(),
    quantity: integer('quantity').notNull(),
    unitPriceMinor: integer('unit_price_minor').notNull(),
    lineTotalMinor: integer('line_total_minor').notNull(),
  },
  (table) => [
    index('order_lines_order_idx').on(table.orderId),
    index('order_lines_sku_idx').on(table.sku),
    check('order_lines_quantity_positive', sql`${table.quantity} > 0`),
  ],
);

/** Every payment-provider event received, by the provider's event id: a replayed event finds its row and stops. */
export const paymentEvents = pgTable('payment_events', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  orderId: text('order_id').references(() => orders.id, { onDelete: 'set null' }),
  /** What applying it did, e.g. `paid`, `ignored`, `flagged: amount_mismatch`. */
  outcome: text('outcome').notNull(),
  payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});

/** An order row as stored. */
export type OrderRow = typeof orders.$inferSelect;
/** An order line row as stored. */
export type OrderLineRow = typeof orderLines.$inferSelect;
