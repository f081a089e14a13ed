import { z } from 'zod';

/** Largest quantity one wholesale quote covers. */
export const QUOTE_MAX_QUANTITY = 100_000;

/** Today's date in UTC as YYYY-MM-DD (read when a request is checked, not when the module loads). */
function todayUtc(): string {
  return new Date().toISOString().slice(0, 10);
}

/** A date the customer wants the goods, YYYY-MM-DD, today or later. */
export const DeliveryDateSchema = z.iso
  .date('Enter the delivery date as a date such as 2027-03-01.')
  .refine((date) => date >= todayUtc(), { message: 'The delivery date cannot be in the past.' });

/** Body of `POST /api/quotes`: what the customer asks for. */
export const QuoteCreateSchema = z.object({
  sku: z.string().trim().min(1, 'Choose a product.').max(80, 'A SKU can be at most 80 characters long.'),
  quantity: z
    .number('Enter the quantity as a number.')
    .int('The quantity must be a whole number.')
    .positive('The quantity must be at least 1.')
    .max(QUOTE_MAX_QUANTITY, `One quote can cover at most ${QUOTE_MAX_QUANTITY.toLocaleString('en-GB')} units.`),
  /** Date the customer wants the goods, YYYY-MM-DD. */
  deliveryDate: DeliveryDateSchema,
  customerName: z
    .string()
    .trim()
    .min(1, "Give the customer's name.")
    .max(120, "A customer's name can be at most 120 characters long."),
});
/** Body of `POST /api/quotes`. */
export type QuoteCreate = z.infer<typeof QuoteCreateSchema>;

/** The farm figures behind a quote's lead time: the settings used and what estimateFarmCapacity gave. */
export const QuoteFarmSchema = z.object({
  printers: z.number().int(),
  hoursPerDay: z.number(),
  /** Complete units on one plate when the parts go together; else the copies of the part that fits fewest. */
  copiesPerPlate: z.number().int(),
  /** Plates one unit needs under the plate rule (absent on quotes saved before it was kept: 1). */
  platesPerUnit: z.number().int().optional(),
  /** The plate rule in words, e.g. `2 plates per unit: body 1 per plate, floor plug 4 per plate`. */
  plateText: z.string().optional(),
  /** Plates of each plate group (one group when the parts go together, one per part otherwise). */
  groups: z
    .array(z.object({ unitsPerPlate: z.number().int(), plates: z.number().int(), plateTimeMin: z.number() }))
    .optional(),
  failureRatePct: z.number(),
  plateChangeMin: z.number(),
  handlingDays: z.number(),
  /** Print time of one unit, from the variant's production estimate. */
  printTimeMin: z.number(),
  plates: z.number().int(),
  platesPerPrinter: z.number().int(),
  plateTimeMin: z.number(),
  expectedGoodUnits: z.number(),
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

/** A saved wholesale quote. */
export const QuoteSchema = z.object({
  id: z.string(),
  /** Human reference, e.g. `Q-0007`. */
  reference: z.string(),
  sku: z.string(),
  productName: z.string(),
  familyName: z.string(),
  customerName: z.string(),
  quantity: z.number().int(),
  deliveryDate: z.string(),
  currency: z.string(),
  /** Production cost of one unit (the variant's estimate). */
  unitCostCents: z.number().int(),
  /** Catalogue price of one unit. */
  listPriceCents: z.number().int(),
  /** Quantity-break discount applied to the list price. */
  discountPct: z.number(),
  unitPriceCents: z.number().int(),
  totalPriceCents: z.number().int(),
  /** (unit price − unit cost) / unit price, percent. */
  marginPct: z.number(),
  farm: QuoteFarmSchema,
  /** Quote date + lead time (calendar days). */
  earliestDeliveryDate: z.string(),
  /** Whether the earliest delivery date is on or before the date asked for. */
  feasible: z.boolean(),
  breaks: z.array(QuoteBreakSchema),
  createdBy: z.object({ id: z.string(), name: z.string() }),
  createdAt: z.string(),
});
/** A saved wholesale quote (see {@link QuoteSchema}). */
export type Quote = z.infer<typeof QuoteSchema>;

/** A quote in the list. */
export const QuoteSummarySchema = QuoteSchema.pick({
  id: true,
  reference: true,
  sku: true,
  productName: true,
  customerName: true,
  quantity: true,
  deliveryDate: true,
  currency: true,
  unitPriceCents: true,
  totalPriceCents: true,
  marginPct: true,
  earliestDeliveryDate: true,
  feasible: true,
  createdAt: true,
}).extend({ createdByName: z.string() });
/** A quote in the list (see {@link QuoteSummarySchema}). */
export type QuoteSummary = z.infer<typeof QuoteSummarySchema>;

/** Answer of `GET /api/quotes` (newest first). */
export const QuoteListResponseSchema = z.object({ quotes: z.array(QuoteSummarySchema) });
/** Answer of `GET /api/quotes`. */
export type QuoteListResponse = z.infer<typeof QuoteListResponseSchema>;

/** Route parameters `:id` of a quote. */
export const QuoteIdParamsSchema = z.object({ id: z.uuid('This is not a quote reference we know.') });
