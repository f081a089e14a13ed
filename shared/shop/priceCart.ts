/**
 * Prices a cart from the catalogue and the settings alone (nothing the browser says about money is used):
 * unit price with VAT, one parcel per unit whose billable weight is the heavier of actual and dimensional weight
 * under the shop's divisor, the shipping zone of the country, the weight band of the total, the VAT inside the total.
 */
import type { SalesSettings } from '../schemas/sales';
import type { ShopQuote, ShippingZone } from '../schemas/shop';
import { dimensionalWeight, G_PER_LB } from '../shipping/dimensionalWeight';
import { shippingBox } from '../shipping/shippingBox';
import { grossFromNet, vatInGross } from './vat';

/** What pricing needs to know about a sellable variant. */
export interface SellableVariant {
  sku: string;
  productName: string;
  /** Catalogue price before VAT, minor units of the shop currency. */
  unitNetMinor: number;
  meshSha256: string;
  /** The product's overall size (any order). */
  sizeMm: readonly number[];
  massG: number;
}

/** A cart line with its variant found. */
export interface CartLine {
  variant: SellableVariant;
  quantity: number;
}

/** Why a cart cannot be priced, naming the field. */
export class CartPricingError extends Error {
  /**
   * @param field - dotted path of the field, e.g. `shipTo.country`
   * @param message - for people
   */
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
  }
}

/**
 * The shop price of one unit, VAT included.
 * @param unitNetMinor - catalogue price before VAT
 * @param vatRatePct - VAT rate
 */
export function shopUnitPrice(unitNetMinor: number, vatRatePct: number): number {
  return grossFromNet(unitNetMinor, vatRatePct);
}

/**
 * Billable weight of one unit's parcel in kilograms under the shop's divisor.
 * @param variant - size and mass
 * @param settings - packaging, divisors and the shop's divisor id
 */
export function parcelBillableKg(variant: Pick<SellableVariant, 'sizeMm' | 'massG'>, settings: SalesSettings): number {
  const divisor =
    settings.dimDivisors.find((d) => d.id === settings.shop.shipping.divisorId) ??
    settings.dimDivisors.find((d) => d.unitSystem === 'metric') ??
    settings.dimDivisors[0];
  const box = shippingBox(variant.sizeMm, variant.massG, settings.packaging);
  const weight = dimensionalWeight(box.outerMm, box.actualMassG, divisor);
  return weight.weightUnit === 'kg' ? weight.billableWeight : (weight.billableWeight * G_PER_LB) / 1000;
}

/**
 * The zone that ships to a country: the one naming it, else the one with an empty list (everywhere else).
 * @param zones - the shipping table's zones
 * @param country - ISO 3166-1 alpha-2
 */
export function zoneFor(zones: readonly ShippingZone[], country: string): ShippingZone | undefined {
  return zones.find((zone) => zone.countries.includes(country)) ?? zones.find((zone) => zone.countries.length === 0);
}

/**
 * The priced cart. Throws {@link CartPricingError} for a country no zone covers or a weight over the last band.
 * @param lines - variants and quantities (already checked to be published)
 * @param country - destination
 * @param settings - the sales settings (shop part and packaging)
 */
export function priceCart(lines: readonly CartLine[], country: string, settings: SalesSettings): ShopQuote {
  const shop = settings.shop;
  const priced = lines.map(({ variant, quantity }) => {
    const unitPriceMinor = shopUnitPrice(variant.unitNetMinor, shop.vatRatePct);
    return {
      sku: variant.sku,
      productName: variant.productName,
      quantity,
      unitPriceMinor,
      lineTotalMinor: unitPriceMinor * quantity,
      meshSha256: variant.meshSha256,
      billableKg: parcelBillableKg(variant, settings),
    };
  });
  const billableKg = priced.reduce((sum, line) => sum + line.billableKg * line.quantity, 0);
  const zone = zoneFor(shop.shipping.zones, country);
  if (!zone) throw new CartPricingError('shipTo.country', 'we do not ship to that country yet');
  const band = shop.shipping.weightBandsKg.findIndex((upToKg) => billableKg <= upToKg + 1e-9);
  if (band < 0) {
    const last = shop.shipping.weightBandsKg.at(-1) ?? 0;
    throw new CartPricingError(
      'items',
      `the parcels weigh ${Math.round(billableKg)} kg to ship, more than the ${last} kg we send in one order: split it into smaller orders`,
    );
  }
  const subtotalMinor = priced.reduce((sum, line) => sum + line.lineTotalMinor, 0);
  const shippingMinor = zone.ratesMinor[band];
  const totalMinor = subtotalMinor + shippingMinor;
  return {
    currency: shop.currency,
    lines: priced,
    subtotalMinor,
    shippingMinor,
    vatMinor: vatInGross(totalMinor, shop.vatRatePct),
    vatRatePct: shop.vatRatePct,
    totalMinor,
    billableKg,
    shippingZone: zone.label,
  };
}
