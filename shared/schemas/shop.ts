/** Shapes of the public shop: its settings (currency, VAT, shipping table), the ship-to address and checkout. */
import { z } from 'zod';
import { isValidCountryCode } from '../shop/countryCodes';
import { RegionSchema } from './birdfit';

/** A currency as ISO 4217 letters, e.g. `EUR`. */
export const CurrencySchema = z.string().regex(/^[A-Z]{3}$/, 'The currency must be three capital letters such as EUR.');

/** One shipping zone: the countries it covers and the price of each weight band, VAT included. */
export const ShippingZoneSchema = z.object({
  id: z.string().trim().min(1).max(40),
  label: z.string().trim().min(1).max(80),
  /** ISO 3166-1 alpha-2 codes; an empty list means every country no other zone names. */
  countries: z.array(z.string().length(2)).max(300),
  /** Price for each weight band (same order as `weightBandsKg`), in minor units of the shop currency. */
  ratesMinor: z.array(z.number().int().nonnegative()).min(1).max(20),
});
/** A shipping zone (see {@link ShippingZoneSchema}). */
export type ShippingZone = z.infer<typeof ShippingZoneSchema>;

/** The shipping table: zones × weight bands, priced by billable weight (heavier of actual and dimensional). */
export const ShippingTableSchema = z
  .object({
    /** Which of the sales settings' dimensional-weight divisors applies (its id). */
    divisorId: z.string().trim().min(1).max(40),
    /** Upper bound of each band, ascending; a parcel heavier than the last band cannot be shipped. */
    weightBandsKg: z.array(z.number().positive().max(1000)).min(1).max(20),
    zones: z.array(ShippingZoneSchema).min(1).max(30),
  })
  .superRefine((table, ctx) => {
    table.weightBandsKg.forEach((kg, i) => {
      if (i > 0 && kg <= table.weightBandsKg[i - 1])
        ctx.addIssue({ code: 'custom', path: ['weightBandsKg', i], message: 'weight bands must go up' });
    });
    table.zones.forEach((zone, i) => {
      if (zone.ratesMinor.length !== table.weightBandsKg.length)
        ctx.addIssue({
          code: 'custom',
          path: ['zones', i, 'ratesMinor'],
          message: `The zone ${zone.label} needs one price for each of the ${table.weightBandsKg.length} weight bands.`,
        });
    });
  });
/** The shipping table (see {@link ShippingTableSchema}). */
export type ShippingTable = z.infer<typeof ShippingTableSchema>;

/** How the shop sells: currency, VAT, how long a checkout stays open, the shipping table. */
export const ShopSettingsSchema = z.object({
  currency: CurrencySchema,
  /** VAT rate charged on goods and shipping; 0 where the studio does not charge VAT. */
  vatRatePct: z.number().min(0).max(50),
  /** Show shop prices with VAT included (consumers) or before VAT with "+ VAT" (the charge is the same). */
  showPricesWithVat: z.boolean(),
  /** An unpaid order expires after this long at the payment page. */
  checkoutExpiryMin: z
    .number()
    .int()
    .min(30)
    .max(24 * 60),
  shipping: ShippingTableSchema,
});
/** Shop settings (see {@link ShopSettingsSchema}). */
export type ShopSettings = z.infer<typeof ShopSettingsSchema>;

/** Text a person types: trimmed, with a length limit and a message that names the field in words. */
function text(label: string, max: number, min = 1) {
  return z
    .string(`${label} is required`)
    .trim()
    .min(min, `${label} is required`)
    .max(max, `${label} is at most ${max} characters`);
}

/** Where an order is shipped. */
export const ShipToSchema = z.object({
  name: text('name', 120),
  line1: text('address line 1', 120),
  line2: z.string().trim().max(120, 'address line 2 is at most 120 characters').default(''),
  city: text('town or city', 80),
  /** County, state or province, where the country uses one. */
  region: z.string().trim().max(80, 'region is at most 80 characters').default(''),
  postalCode: text('postcode', 16).regex(
    /^[A-Za-z0-9][A-Za-z0-9 -]{0,15}$/,
    'postcode has characters a postcode never has',
  ),
  country: z
    .string('Choose a country.')
    .trim()
    .toUpperCase()
    .refine(isValidCountryCode, 'country must be chosen from the list'),
});
/** A shipping address (see {@link ShipToSchema}). */
export type ShipTo = z.infer<typeof ShipToSchema>;

/** Most units of one SKU in one order. */
export const MAX_LINE_QUANTITY = 50;
/** Most lines in one order. */
export const MAX_ORDER_LINES = 30;

/** One cart line as the browser sends it: only the SKU and how many; prices are looked up on the server. */
export const CartItemSchema = z.object({
  sku: z.string('Enter a SKU.').trim().min(1, 'Enter a SKU.').max(80),
  quantity: z
    .number('quantity must be a whole number')
    .int('quantity must be a whole number')
    .min(1, 'quantity must be at least 1')
    .max(MAX_LINE_QUANTITY, `quantity must be at most ${MAX_LINE_QUANTITY}`),
});
/** A cart line (see {@link CartItemSchema}). */
export type CartItem = z.infer<typeof CartItemSchema>;

/** E-mail of a customer. */
export const CustomerEmailSchema = z
  .string('Enter an e-mail address.')
  .trim()
  .toLowerCase()
  .max(254, 'e-mail is at most 254 characters')
  .pipe(z.email('e-mail is not a valid address'));

/** Body of `POST /api/shop/checkout` (and of the quote before it). Any price or total the browser adds is dropped. */
export const CheckoutRequestSchema = z.object({
  email: CustomerEmailSchema,
  shipTo: ShipToSchema,
  items: z
    .array(CartItemSchema, 'Add at least one product.')
    .min(1, 'the cart is empty')
    .max(MAX_ORDER_LINES, `at most ${MAX_ORDER_LINES} lines in one order`),
});
/** Body of `POST /api/shop/checkout`. */
export type CheckoutRequest = z.infer<typeof CheckoutRequestSchema>;

/** Body of `POST /api/shop/quote`: the cart and the destination country, for the total before paying. */
export const ShopQuoteRequestSchema = z.object({
  country: ShipToSchema.shape.country,
  items: CheckoutRequestSchema.shape.items,
});
/** Body of `POST /api/shop/quote`. */
export type ShopQuoteRequest = z.infer<typeof ShopQuoteRequestSchema>;

/** One priced line of a quote or an order. */
export const PricedLineSchema = z.object({
  sku: z.string(),
  productName: z.string(),
  quantity: z.number().int(),
  /** Unit price charged, VAT included, minor units. */
  unitPriceMinor: z.number().int(),
  lineTotalMinor: z.number().int(),
  /** Mesh content hash of the variant sold (what the farm prints). */
  meshSha256: z.string(),
  /** Billable weight of one unit's parcel. */
  billableKg: z.number(),
});
/** A priced line (see {@link PricedLineSchema}). */
export type PricedLine = z.infer<typeof PricedLineSchema>;

/** What an order costs, computed on the server from SKUs and settings. */
export const ShopQuoteSchema = z.object({
  currency: z.string(),
  lines: z.array(PricedLineSchema),
  subtotalMinor: z.number().int(),
  shippingMinor: z.number().int(),
  /** VAT contained in the total. */
  vatMinor: z.number().int(),
  vatRatePct: z.number(),
  totalMinor: z.number().int(),
  /** Sum of the billable weights of the parcels (one per unit). */
  billableKg: z.number(),
  shippingZone: z.string(),
});
/** A priced cart (see {@link ShopQuoteSchema}). */
export type ShopQuote = z.infer<typeof ShopQuoteSchema>;

/** One value on a product's axis, as the variant picker shows it. */
export const ShopAxisValueSchema = z.object({
  value: z.union([z.string(), z.number(), z.boolean()]),
  label: z.string(),
  /** Swatch colour of a colour value. */
  swatchHex: z.string().nullable(),
});

/** One axis of a product (colour, entry size, trim ...). */
export const ShopAxisSchema = z.object({
  key: z.string(),
  label: z.string(),
  values: z.array(ShopAxisValueSchema),
});
/** A product axis (see {@link ShopAxisSchema}). */
export type ShopAxis = z.infer<typeof ShopAxisSchema>;

/** A caution shown with a variant. */
export const ShopCautionSchema = z.object({ title: z.string(), text: z.string() });

/** A published variant as the shop shows it (VAT-inclusive price; figures in mm, shown in inches too). */
/** A species a variant suits, with the region whose table it comes from. */
export const ShopBirdSchema = z.object({ name: z.string(), region: RegionSchema });
/** A suited species (see {@link ShopBirdSchema}). */
export type ShopBird = z.infer<typeof ShopBirdSchema>;

/** A caution that applies in one region only (an introduced species the entry admits there). */
export const ShopRegionCautionSchema = z.object({ region: RegionSchema, text: z.string() });
/** A regional caution (see {@link ShopRegionCautionSchema}). */
export type ShopRegionCaution = z.infer<typeof ShopRegionCautionSchema>;

export const ShopVariantSchema = z.object({
  sku: z.string(),
  productName: z.string(),
  axisValues: z.record(z.string(), z.union([z.string(), z.number(), z.boolean()])),
  colour: z.object({ id: z.string(), name: z.string(), hex: z.string() }).nullable(),
  material: z.string(),
  /** Price the customer pays for one unit, VAT included, minor units. */
  priceMinor: z.number().int(),
  entryHoleMm: z.number(),
  /**
   * Outside size, width × depth × height: of the assembled box when `sizeKind` is `assembled` (its body, the largest
   * part), else of the parts laid out for printing (variants computed before part sizes were kept).
   */
  sizeMm: z.tuple([z.number(), z.number(), z.number()]),
  sizeKind: z.enum(['assembled', 'as_printed']),
  /** Parts printed and put together by the customer (1: printed in one piece). */
  partCount: z.number().int().positive(),
  massG: z.number(),
  /** Names of the wanted species it suits (either region), for the filter. */
  birds: z.array(z.string()),
  /** The same species with the region whose table they come from. */
  suits: z.array(ShopBirdSchema),
  /** Regional cautions: species the entry admits that are introduced (unwanted) in a region. */
  regionCautions: z.array(ShopRegionCautionSchema),
  mounting: z.string(),
  cautions: z.array(ShopCautionSchema),
  meshSha256: z.string(),
});
/** A shop variant (see {@link ShopVariantSchema}). */
export type ShopVariant = z.infer<typeof ShopVariantSchema>;

/** A sample photo as the shop serves it. */
export const ShopPhotoSchema = z.object({
  url: z.string(),
  thumbUrl: z.string(),
  caption: z.string(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
});

/** How prices are shown. */
export const ShopPriceDisplaySchema = z.object({
  currency: z.string(),
  vatRatePct: z.number(),
  showPricesWithVat: z.boolean(),
});
/** How prices are shown (see {@link ShopPriceDisplaySchema}). */
export type ShopPriceDisplay = z.infer<typeof ShopPriceDisplaySchema>;

/** A product (one published family) in the listing. */
export const ShopProductSummarySchema = z.object({
  slug: z.string(),
  name: z.string(),
  description: z.string(),
  fromPriceMinor: z.number().int(),
  colours: z.array(z.object({ id: z.string(), name: z.string(), hex: z.string() })),
  birds: z.array(z.string()),
  /** The species with their regions (for the card). */
  suits: z.array(ShopBirdSchema),
  /** Regions where some version admits an introduced species (the card points to the product page's caution). */
  cautionRegions: z.array(RegionSchema),
  photo: ShopPhotoSchema.nullable(),
  variantCount: z.number().int(),
});
/** A listed product (see {@link ShopProductSummarySchema}). */
export type ShopProductSummary = z.infer<typeof ShopProductSummarySchema>;

/** Answer of `GET /api/shop/products`. */
export const ShopProductListSchema = z.object({
  products: z.array(ShopProductSummarySchema),
  prices: ShopPriceDisplaySchema,
  /** Every species and colour on sale, for the filters. */
  facets: z.object({
    birds: z.array(z.string()),
    colours: z.array(z.object({ id: z.string(), name: z.string(), hex: z.string() })),
  }),
});
/** Answer of `GET /api/shop/products`. */
export type ShopProductList = z.infer<typeof ShopProductListSchema>;

/** Query of `GET /api/shop/products`. */
export const ShopProductQuerySchema = z.object({
  bird: z.string().trim().max(80).optional(),
  colour: z.string().trim().max(40).optional(),
});
/** Query of `GET /api/shop/products`. */
export type ShopProductQuery = z.infer<typeof ShopProductQuerySchema>;

/** Answer of `GET /api/shop/products/:slug`. */
export const ShopProductSchema = ShopProductSummarySchema.omit({ photo: true }).extend({
  axes: z.array(ShopAxisSchema),
  variants: z.array(ShopVariantSchema),
  photos: z.array(ShopPhotoSchema),
  prices: ShopPriceDisplaySchema,
});
/** Answer of `GET /api/shop/products/:slug`. */
export type ShopProduct = z.infer<typeof ShopProductSchema>;

/** Route parameter `:slug` of a product. */
export const ShopSlugParamsSchema = z.object({ slug: z.string().regex(/^[a-z0-9-]{1,80}$/, 'no such product') });

/** Answer of `POST /api/shop/checkout`. */
export const CheckoutResponseSchema = z.object({ orderId: z.string(), checkoutUrl: z.string() });
/** Answer of `POST /api/shop/checkout`. */
export type CheckoutResponse = z.infer<typeof CheckoutResponseSchema>;
