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
} from 'drizzle-orm/pg-core';
import type { SalesSettings } from '../../../shared/schemas/sales';
import type { QuoteFarm } from '../../../shared/schemas/quote';
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
    sku: text('sku').notNull(),
    productName: text('product_name').notNull(),
    familyName: text('family_name').notNull(),
    customerName: text('customer_name').notNull(),
    quantity: integer('quantity').notNull(),
    deliveryDate: date('delivery_date', { mode: 'string' }).notNull(),
    currency: text('currency').notNull(),
    unitCostCents: integer('unit_cost_cents').notNull(),
    listPriceCents: integer('list_price_cents').notNull(),
    discountPct: doublePrecision('discount_pct').notNull(),
    unitPriceCents: integer('unit_price_cents').notNull(),
    totalPriceCents: integer('total_price_cents').notNull(),
    marginPct: doublePrecision('margin_pct').notNull(),
    farm: jsonb('farm').$type<QuoteFarm>().notNull(),
    breaks: jsonb('breaks')
      .$type<Array<{ minQuantity: number; discountPct: number; unitPriceCents: number }>>()
      .notNull(),
    earliestDeliveryDate: date('earliest_delivery_date', { mode: 'string' }).notNull(),
    feasible: boolean('feasible').notNull(),
    createdById: text('created_by_id')
      .notNull()
      .references(() => people.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index('quotes_created_at_idx').on(table.createdAt),
    check('quotes_quantity_positive', sql`${table.quantity} > 0`),
  ],
);

/** A quote row as stored. */
export type QuoteRow = typeof quotes.$inferSelect;
