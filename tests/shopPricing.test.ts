/**
 * Shop arithmetic against published rules: the VAT inside a VAT-inclusive price, and the billable weight of a
 * parcel as the heavier of actual and dimensional weight under carriers' divisors; then a whole cart.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import type { SalesSettings } from '../shared/schemas/sales';
import { CartPricingError, parcelBillableKg, priceCart, zoneFor } from '../shared/shop/priceCart';
import { grossFromNet, netOfGross, vatInGross } from '../shared/shop/vat';

describe('VAT in minor units', () => {
  // source: HM Revenue & Customs, VAT Notice 700 "The VAT guide", the VAT fraction for working out the VAT in a
  // VAT-inclusive price: rate / (100 + rate), 1/6 at the 20 % standard rate and 7/47 at the former 17.5 % rate
  // (GOV.UK, 2024); the section number is from memory, the amounts below are that fraction applied by us.
  it('takes 1/6 of a VAT-inclusive price at 20 % (£120.00 holds £20.00 VAT)', () => {
    expect(vatInGross(12_000, 20)).toBe(2_000);
    expect(netOfGross(12_000, 20)).toBe(10_000);
    expect(grossFromNet(10_000, 20)).toBe(12_000);
  });
  it('takes 7/47 at 17.5 % (£117.50 holds £17.50 VAT)', () => {
    expect(vatInGross(11_750, 17.5)).toBe(1_750);
  });
  it('rounds to the nearest minor unit (£34.99 at 20 % holds £5.83)', () => {
    // 3499 / 6 = 583.17 → 583 (common practice: round to the nearest penny, no source)
    expect(vatInGross(3_499, 20)).toBe(583);
  });
});

/** Packaging that adds nothing, so the parcel is exactly the product's size and mass. */
const BARE: SalesSettings = {
  ...DEFAULT_SALES_SETTINGS,
  packaging: { paddingMm: 0, boxStepMm: 1, boardThicknessMm: 0, boardGsm: 0, fillMassG: 0 },
};

describe('billable weight of one parcel', () => {
  // source: UPS, "Determine billable weight" (metric): (L × W × H in cm) / 5,000, each dimension rounded, weight
  // rounded up to the next whole kilogram; billable weight is the larger of actual and dimensional weight.
  it('uses the dimensional weight of a light, bulky box (40 × 30 × 20 cm → 4.8 → 5 kg)', () => {
    const settings = { ...BARE, shop: { ...BARE.shop, shipping: { ...BARE.shop.shipping, divisorId: 'metric-5000' } } };
    expect(parcelBillableKg({ sizeMm: [400, 300, 200], massG: 1_200 }, settings)).toBe(5);
  });
  it('uses the actual weight when it is heavier (9.5 kg → 10 kg)', () => {
    const settings = { ...BARE, shop: { ...BARE.shop, shipping: { ...BARE.shop.shipping, divisorId: 'metric-5000' } } };
    expect(parcelBillableKg({ sizeMm: [400, 300, 200], massG: 9_500 }, settings)).toBe(10);
  });
  // source: UPS, "Determine billable weight" (US): (L × W × H in inches) / 139, rounded up to the next whole pound;
  // 1 lb = 0.45359237 kg exactly (International yard and pound agreement, 1959).
  it('converts an imperial result to kilograms (12 × 12 × 12 in → 12.43 → 13 lb → 5.897 kg)', () => {
    const settings = {
      ...BARE,
      shop: { ...BARE.shop, shipping: { ...BARE.shop.shipping, divisorId: 'ups-fedex-us' } },
    };
    expect(parcelBillableKg({ sizeMm: [304.8, 304.8, 304.8], massG: 500 }, settings)).toBeCloseTo(13 * 0.45359237, 9);
  });
});

describe('pricing a cart', () => {
  const variant = {
    sku: 'FH-T-1',
    productName: 'Test box',
    unitNetMinor: 2_900,
    meshSha256: 'f'.repeat(64),
    sizeMm: [200, 180, 260],
    massG: 600,
  };
  it('adds the zone and band price of the total billable weight and reports the VAT inside the total', () => {
    const quote = priceCart([{ variant, quantity: 2 }], 'GB', DEFAULT_SALES_SETTINGS);
    const unit = grossFromNet(2_900, 20);
    expect(quote.lines[0].unitPriceMinor).toBe(unit);
    expect(quote.subtotalMinor).toBe(unit * 2);
    const band = DEFAULT_SALES_SETTINGS.shop.shipping.weightBandsKg.findIndex((kg) => quote.billableKg <= kg);
    expect(quote.shippingMinor).toBe(DEFAULT_SALES_SETTINGS.shop.shipping.zones[0].ratesMinor[band]);
    expect(quote.totalMinor).toBe(quote.subtotalMinor + quote.shippingMinor);
    expect(quote.vatMinor).toBe(vatInGross(quote.totalMinor, 20));
  });
  it('finds the zone naming the country, else the rest-of-the-world zone', () => {
    const zones = DEFAULT_SALES_SETTINGS.shop.shipping.zones;
    expect(zoneFor(zones, 'FR')?.id).toBe('europe');
    expect(zoneFor(zones, 'JP')?.id).toBe('world');
  });
  it('refuses a cart heavier than the last weight band, naming the items', () => {
    expect(() =>
      priceCart([{ variant: { ...variant, massG: 40_000 }, quantity: 1 }], 'GB', DEFAULT_SALES_SETTINGS),
    ).toThrow(CartPricingError);
  });
});
