import { z } from 'zod';
import { DEFAULT_SHOP_SETTINGS } from '../shop/defaultShopSettings';
import { DimDivisorSchema, PackagingRulesSchema } from './shipping';
import { DEFAULT_WORKSHOP_ADDRESS } from '../planning/defaultWorkshopAddress';
import { FarmAddressSchema } from './farm';
import { ShopSettingsSchema } from './shop';

/** The print farm as quotes see it: how many machines, for how long a day, and how often a plate fails. */
export const FarmSettingsSchema = z.object({
  printers: z.number().int().positive().max(10_000),
  /** Machine hours per day (24 for a farm that runs overnight). */
  hoursPerDay: z.number().gt(0).max(24),
  /** Copies on one build plate; null = as many as fit the plate (the analysis' plate fit), at least 1. */
  copiesPerPlate: z.number().int().positive().max(500).nullable(),
  failureRatePct: z.number().min(0).lt(100),
  /** Warm-up and plate change between plates. */
  plateChangeMin: z.number().nonnegative().max(600),
  /** Days added for packing and dispatch. */
  handlingDays: z.number().int().nonnegative().max(60),
});
/** Farm settings (see {@link FarmSettingsSchema}). */
export type FarmSettings = z.infer<typeof FarmSettingsSchema>;

/** From this quantity on, the unit price drops by this share. */
export const QuantityBreakSchema = z.object({
  minQuantity: z.number().int().positive(),
  discountPct: z.number().min(0).lt(100),
});
/** A quantity break (see {@link QuantityBreakSchema}). */
export type QuantityBreak = z.infer<typeof QuantityBreakSchema>;

/**
 * Settings of the sales area: shipping divisors with their dates, packaging, farm, quantity breaks, the shop
 * (currency, VAT, shipping zones × weight bands; defaults for settings saved before the shop existed) and the
 * workshop address planned runs are delivered to.
 */
export const SalesSettingsSchema = z
  .object({
    dimDivisors: z.array(DimDivisorSchema).min(1).max(20),
    packaging: PackagingRulesSchema,
    farm: FarmSettingsSchema,
    /** Ascending by quantity; the largest break at or below the quantity applies. */
    quantityBreaks: z
      .array(QuantityBreakSchema)
      .max(10)
      .refine((breaks) => breaks.every((b, i) => i === 0 || b.minQuantity > breaks[i - 1].minQuantity), {
        message: 'List the quantity breaks from the smallest quantity to the largest.',
      }),
    shop: ShopSettingsSchema.default(DEFAULT_SHOP_SETTINGS),
    /** Where the farm delivers planned runs (the studio's workshop); a default for settings saved before it existed. */
    workshopAddress: FarmAddressSchema.default(DEFAULT_WORKSHOP_ADDRESS),
  })
  .superRefine((settings, ctx) => {
    const ids = settings.dimDivisors.map((d) => d.id);
    const repeated = ids.findIndex((id, i) => ids.indexOf(id) !== i);
    if (repeated >= 0)
      ctx.addIssue({
        code: 'custom',
        path: ['dimDivisors', repeated, 'id'],
        message: `Two shipping divisors share the identifier “${ids[repeated]}”: give each its own.`,
      });
    if (!ids.includes(settings.shop.shipping.divisorId))
      ctx.addIssue({
        code: 'custom',
        path: ['shop', 'shipping', 'divisorId'],
        message:
          'The shop’s shipping table needs one of the shipping divisors: choose one, or keep the divisor it uses.',
      });
  });
/** Sales settings (see {@link SalesSettingsSchema}). */
export type SalesSettings = z.infer<typeof SalesSettingsSchema>;

/** One line of the price list: a published variant and what it costs. */
export const PriceListRowSchema = z.object({
  sku: z.string(),
  productName: z.string(),
  familyName: z.string(),
  material: z.string(),
  colour: z.string(),
  entryHoleDiameterMm: z.number(),
  /** Mass of every part of the product. */
  massG: z.number(),
  currency: z.string(),
  unitPriceCents: z.number().int().nonnegative(),
});
/** A price list line (see {@link PriceListRowSchema}). */
export type PriceListRow = z.infer<typeof PriceListRowSchema>;

/** Route parameters `:sku`. */
export const SkuParamsSchema = z.object({ sku: z.string().trim().min(1).max(80) });
/** Route parameters `:id` of a family. */
export const FamilyIdParamsSchema = z.object({ id: z.string().trim().min(1).max(80) });
