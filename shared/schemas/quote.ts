import { z } from 'zod';

/** Largest quantity one wholesale quote covers. */
export const QUOTE_MAX_QUANTITY = 100_000;

/** Body of `POST /api/quotes`: what the customer asks for. */
export const QuoteCreateSchema = z.object({
  sku: z.string().trim().min(1, 'sku is required').max(80),
  quantity: z
    .number()
    .int('quantity must be a whole number')
    .positive('quantity must be at least 1')
    .max(QUOTE_MAX_QUANTITY),
  /** Date the customer wants the goods, YYYY-MM-DD. */
  deliveryDate: z.iso.date('deliveryDate must be a date like 2027-03-01'),
  customerName: z.string().trim().min(1, 'customerName is required').max(120),
});
/** Body of `POST /api/quotes`. */
export type QuoteCreate = z.infer<typeof QuoteCreateSchema>;

/** The farm figures behind a quote's lead time: the settings used and what estimateFarmCapacity gave. */
export const QuoteFarmSchema = z.object({
  printers: z.number().int(),
  hoursPerDay: z.number(),
  copiesPerPlate: z.number().int(),
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
export const QuoteIdParamsSchema = z.object({ id: z.uuid('id must be a quote id') });
