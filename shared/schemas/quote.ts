import { z } from 'zod';
import { isoDay } from '../format';

/** Largest quantity one quote line covers. */
export const QUOTE_MAX_QUANTITY = 100_000;
/** Most lines one quote carries. */
export const QUOTE_MAX_LINES = 50;
/** Days a new quote stays valid when no validity date is given (common practice for trade quotes, no source). */
export const QUOTE_DEFAULT_VALID_DAYS = 30;
/** Largest money amount a quote field takes, in cents (1,000,000.00). */
const MAX_AMOUNT_CENTS = 100_000_000;

/** Today's date in UTC as YYYY-MM-DD (read when a request is checked, not when the module loads). */
export function todayUtc(): string {
  return isoDay();
}

/** A date the customer wants the goods, YYYY-MM-DD, today or later. */
export const DeliveryDateSchema = z.iso
  .date('Enter the delivery date as a date such as 2027-03-01.')
  .refine((date) => date >= todayUtc(), { message: 'The delivery date cannot be in the past.' });

/** The last day the quote's prices hold, YYYY-MM-DD, today or later. */
export const ValidUntilSchema = z.iso
  .date('Enter the date the quote is valid until as a date such as 2027-03-01.')
  .refine((date) => date >= todayUtc(), { message: 'The quote cannot be valid only until a day that has passed.' });

/** The states of a quote. `expired` is also derived: a draft or sent quote past its validity date reads as expired. */
export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'expired'] as const;
/** A quote's state (see {@link QUOTE_STATUSES}). */
export const QuoteStatusSchema = z.enum(QUOTE_STATUSES, 'Choose draft, sent, accepted or expired.');
/** A quote's state. */
export type QuoteStatus = z.infer<typeof QuoteStatusSchema>;

/** One line as the sales person enters it. */
export const QuoteLineInputSchema = z.object({
  sku: z
    .string('Choose a product for every line.')
    .trim()
    .min(1, 'Choose a product for every line.')
    .max(80, 'A SKU can be at most 80 characters long.'),
  quantity: z
    .number('Enter the quantity as a number, such as 50.')
    .int('Quantity must be a whole number, such as 50: quotes are for whole units.')
    .positive('Quantity must be at least 1.')
    .max(QUOTE_MAX_QUANTITY, `One line can cover at most ${QUOTE_MAX_QUANTITY.toLocaleString('en-GB')} units.`),
  /** Unit price agreed with the customer; null or left out = the quantity-break price of the catalogue. */
  unitPriceCents: z
    .number('Enter the unit price as an amount, such as 12.50.')
    .int('Enter the unit price to the cent, such as 12.50.')
    .nonnegative('The unit price cannot be below zero.')
    .max(MAX_AMOUNT_CENTS, 'A unit price can be at most 1,000,000.00.')
    .nullable()
    .optional(),
});
/** One line as entered. */
export type QuoteLineInput = z.infer<typeof QuoteLineInputSchema>;

/** Body of `POST /api/quotes` and `PUT /api/quotes/:id`: what the customer asks for and on what terms. */
export const QuoteInputSchema = z.object({
  customerName: z
    .string("Enter the customer's name.")
    .trim()
    .min(1, "Enter the customer's name.")
    .max(120, "A customer's name can be at most 120 characters long."),
  /** Date the customer wants the goods, YYYY-MM-DD. */
  deliveryDate: DeliveryDateSchema,
  /** Last day the quote holds; left out = {@link QUOTE_DEFAULT_VALID_DAYS} days from today. */
  validUntil: ValidUntilSchema.optional(),
  terms: z
    .string('Write the terms as text.')
    .trim()
    .max(2000, 'Terms can be at most 2,000 characters long.')
    .default(''),
  /** Sales tax (VAT) rate in percent, at most two decimals; 0 when no tax is charged. */
  taxRatePct: z
    .number('Enter the tax rate as a number, such as 20.')
    .min(0, 'The tax rate cannot be below 0 %.')
    .max(100, 'The tax rate can be at most 100 %.')
    .refine((pct) => Math.abs(pct * 100 - Math.round(pct * 100)) < 1e-6, {
      message: 'Give the tax rate with at most two decimals, such as 7.25.',
    })
    .default(0),
  shippingCents: z
    .number('Enter the shipping as an amount, such as 35.00.')
    .int('Enter the shipping to the cent, such as 35.00.')
    .nonnegative('Shipping cannot be below zero.')
    .max(MAX_AMOUNT_CENTS, 'Shipping can be at most 1,000,000.00.')
    .default(0),
  lines: z
    .array(QuoteLineInputSchema, 'Add at least one line.')
    .min(1, 'Add at least one line.')
    .max(QUOTE_MAX_LINES, `One quote can have at most ${QUOTE_MAX_LINES} lines.`),
});
/** Body of `POST /api/quotes` and `PUT /api/quotes/:id` after checking. */
export type QuoteInput = z.infer<typeof QuoteInputSchema>;
/** Body of `POST /api/quotes` as a client sends it (defaults may be left out). */
export type QuoteInputBody = z.input<typeof QuoteInputSchema>;

/** Body of `POST /api/quotes/:id/status`. */
export const QuoteStatusChangeSchema = z.object({ status: QuoteStatusSchema });
/** Body of `POST /api/quotes/:id/status`. */
export type QuoteStatusChange = z.infer<typeof QuoteStatusChangeSchema>;

/** The farm figures of one line: the print per unit and what estimateFarmCapacity gave for its quantity. */
export const QuoteLineFarmSchema = z.object({
  /** Complete units on one plate when the parts go together; else the copies of the part that fits fewest. */
  copiesPerPlate: z.number().int(),
  /** Plates one unit needs under the plate rule (absent on lines saved before it was kept: 1). */
  platesPerUnit: z.number().int().optional(),
  /** The plate rule in words, e.g. `2 plates per unit: body 1 per plate, floor plug 4 per plate`. */
  plateText: z.string().optional(),
  /** Plates of each plate group (one group when the parts go together, one per part otherwise). */
  groups: z
    .array(z.object({ unitsPerPlate: z.number().int(), plates: z.number().int(), plateTimeMin: z.number() }))
    .optional(),
  /** Print time of one unit, from the variant's production estimate. */
  printTimeMin: z.number(),
  plates: z.number().int(),
  platesPerPrinter: z.number().int(),
  plateTimeMin: z.number(),
  expectedGoodUnits: z.number(),
  printDays: z.number(),
});
/** Farm figures of one line (see {@link QuoteLineFarmSchema}). */
export type QuoteLineFarm = z.infer<typeof QuoteLineFarmSchema>;

/**
 * The farm plan behind a quote's lead time: the settings used and the lines' plates and print days, the lines
 * printed one after another on the same printers, then packed and dispatched together.
 */
export const QuoteFarmSchema = z.object({
  printers: z.number().int(),
  hoursPerDay: z.number(),
  failureRatePct: z.number(),
  plateChangeMin: z.number(),
  handlingDays: z.number(),
  plates: z.number().int(),
  printDays: z.number(),
  leadTimeDays: z.number().int(),
});
/** Farm figures of a quote (see {@link QuoteFarmSchema}). */
export type QuoteFarm = z.infer<typeof QuoteFarmSchema>;

/** One quantity break as the quote shows it. */
export const QuoteBreakSchema = z.object({
  minQuantity: z.number().int(),
  discountPct: z.number(),
  unitPriceCents: z.number().int(),
});
/** One quantity break (see {@link QuoteBreakSchema}). */
export type QuoteBreak = z.infer<typeof QuoteBreakSchema>;

/** A priced line of a saved quote; the figures are frozen when the quote is saved. */
export const QuoteLineSchema = z.object({
  sku: z.string(),
  productName: z.string(),
  familyName: z.string(),
  quantity: z.number().int(),
  /** Production cost of one unit (the variant's estimate). */
  unitCostCents: z.number().int(),
  /** Catalogue price of one unit. */
  listPriceCents: z.number().int(),
  /** Quantity-break discount of the catalogue at this quantity. */
  discountPct: z.number(),
  /** List price less the break discount: the default unit price. */
  breakPriceCents: z.number().int(),
  /** Unit price on the quote: the break price, or the one the sales person agreed. */
  unitPriceCents: z.number().int(),
  /** Whether the unit price was entered by hand rather than taken from the breaks. */
  priceSetByHand: z.boolean(),
  /** quantity × unit price. */
  lineTotalCents: z.number().int(),
  /** (unit price − unit cost) / unit price, percent. */
  marginPct: z.number(),
  farm: QuoteLineFarmSchema,
  breaks: z.array(QuoteBreakSchema),
});
/** A priced line (see {@link QuoteLineSchema}). */
export type QuoteLine = z.infer<typeof QuoteLineSchema>;

/** A saved wholesale quote. */
export const QuoteSchema = z.object({
  id: z.string(),
  /** Human reference, e.g. `Q-0007`. */
  reference: z.string(),
  /** State as of today: a draft or sent quote past its validity date reads as expired. */
  status: QuoteStatusSchema,
  customerName: z.string(),
  deliveryDate: z.string(),
  validUntil: z.string(),
  terms: z.string(),
  currency: z.string(),
  lines: z.array(QuoteLineSchema),
  /** Sum of the line totals. */
  subtotalCents: z.number().int(),
  shippingCents: z.number().int(),
  taxRatePct: z.number(),
  /** Tax on goods and shipping, rounded half up to the cent once for the whole quote. */
  taxCents: z.number().int(),
  /** Subtotal + shipping + tax. */
  totalCents: z.number().int(),
  /** Production cost of all lines. */
  costCents: z.number().int(),
  /** (subtotal − cost) / subtotal, percent; tax and shipping left out. */
  marginPct: z.number(),
  farm: QuoteFarmSchema,
  /** Quote date + lead time (calendar days). */
  earliestDeliveryDate: z.string(),
  /** Whether the earliest delivery date is on or before the date asked for. */
  feasible: z.boolean(),
  /** The quote this one was copied from, if any. */
  copiedFrom: z.object({ id: z.string(), reference: z.string() }).nullable(),
  createdBy: z.object({ id: z.string(), name: z.string() }),
  createdAt: z.string(),
  updatedAt: z.string(),
});
/** A saved wholesale quote (see {@link QuoteSchema}). */
export type Quote = z.infer<typeof QuoteSchema>;

/** A quote in the list. */
export const QuoteSummarySchema = QuoteSchema.pick({
  id: true,
  reference: true,
  status: true,
  customerName: true,
  deliveryDate: true,
  validUntil: true,
  currency: true,
  totalCents: true,
  marginPct: true,
  earliestDeliveryDate: true,
  feasible: true,
  createdAt: true,
}).extend({
  createdByName: z.string(),
  /** Number of lines and units, and the first line's SKU, to recognise the quote by. */
  lineCount: z.number().int(),
  units: z.number().int(),
  firstSku: z.string(),
});
/** A quote in the list (see {@link QuoteSummarySchema}). */
export type QuoteSummary = z.infer<typeof QuoteSummarySchema>;

/** Answer of `GET /api/quotes` (newest first). */
export const QuoteListResponseSchema = z.object({ quotes: z.array(QuoteSummarySchema) });
/** Answer of `GET /api/quotes`. */
export type QuoteListResponse = z.infer<typeof QuoteListResponseSchema>;

/** Route parameters `:id` of a quote. */
export const QuoteIdParamsSchema = z.object({ id: z.uuid('This is not a quote reference we know.') });
