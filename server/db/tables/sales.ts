/** Tables of the sales area: its settings and the saved wholesale quotes. Re-exported from ../schema.ts. */
import { sql } from 'drizzle-orm';
import {
  boolean,
  check,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  serial,
  text,
  timestamp,
  uniqueIndex,
} from 'drizzle-orm/pg-core';
import type { SalesSettings } from '../../../shared/schemas/sales';
import type { QuoteBreak, QuoteFarm, QuoteLineFarm, QuoteStatus } from '../../../shared/schemas/quote';
import { newId } from '../newId';
import { people } from './people';

/** The studio's sales settings (one row, id `studio`): DIM divisors with their dates, packaging, farm, breaks. */
export const salesSettings = pgTable('sales_settings', {
  id: text('id').primaryKey(),
  data: jsonb('data').$type<SalesSettings>().notNull(),
  updatedById: text('updated_by_id').references(() => people.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A saved wholesale quote: the figures are frozen when it is made, so later price changes do not alter it. */
export const quotes = pgTable(
  'quotes',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    /** Running number behind the human reference `Q-0001`. */
    number: serial('number').notNull().unique(),
    customerName: text('customer_name').notNull(),
    deliveryDate: date('delivery_date', { mode: 'string' }).notNull(),
    currency: text('currency').notNull(),
    /** Grand total: goods + shipping + tax (the goods total of quotes made before lines existed, which had neither). */
    totalCents: integer('total_price_cents').notNull(),
    /** Margin on the goods: (subtotal − cost) / subtotal, percent. */
    marginPct: doublePrecision('margin_pct').notNull(),
    /** The farm plan of the whole quote (lines one after another). */
    farm: jsonb('farm').$type<QuoteFarm>().notNull(),
    earliestDeliveryDate: date('earliest_delivery_date', { mode: 'string' }).notNull(),
    feasible: boolean('feasible').notNull(),
    /** Stored state: draft, sent, accepted or expired (set by hand); expiry by date is derived when read. */
    status: text('status').$type<QuoteStatus>().notNull().default('draft'),
    validUntil: date('valid_until', { mode: 'string' }).notNull(),
    terms: text('terms').notNull().default(''),
    taxRatePct: doublePrecision('tax_rate_pct').notNull().default(0),
    shippingCents: integer('shipping_cents').notNull().default(0),
    subtotalCents: integer('subtotal_cents').notNull(),
    taxCents: integer('tax_cents').notNull().default(0),
    costCents: integer('cost_cents').notNull(),
    /** The quote this one was copied from. */
    copiedFromId: text('copied_from_id'),
    createdById: text('created_by_id')
      .notNull()
      .references(() => people.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('quotes_created_at_idx').on(table.createdAt),
    check('quotes_status_known', sql`${table.status} in ('draft', 'sent', 'accepted', 'expired')`),
  ],
);

/** The lines of a quote, in the order the sales person entered them; figures frozen when the quote is saved. */
export const quoteLines = pgTable(
  'quote_lines',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    quoteId: text('quote_id')
      .notNull()
      .references(() => quotes.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    sku: text('sku').notNull(),
    productName: text('product_name').notNull(),
    familyName: text('family_name').notNull(),
    quantity: integer('quantity').notNull(),
    unitCostCents: integer('unit_cost_cents').notNull(),
    listPriceCents: integer('list_price_cents').notNull(),
    discountPct: doublePrecision('discount_pct').notNull(),
    breakPriceCents: integer('break_price_cents').notNull(),
    unitPriceCents: integer('unit_price_cents').notNull(),
    priceSetByHand: boolean('price_set_by_hand').notNull().default(false),
    lineTotalCents: integer('line_total_cents').notNull(),
    marginPct: doublePrecision('margin_pct').notNull(),
    farm: jsonb('farm').$type<QuoteLineFarm>().notNull(),
    breaks: jsonb('breaks').$type<QuoteBreak[]>().notNull(),
  },
  (table) => [
    uniqueIndex('quote_lines_quote_position_idx').on(table.quoteId, table.position),
    check('quote_lines_quantity_positive', sql`${table.quantity} > 0`),
  ],
);

/** A quote line as stored. */
export type QuoteLineRow = typeof quoteLines.$inferSelect;

/** A quote row as stored. */
export type QuoteRow = typeof quotes.$inferSelect;
