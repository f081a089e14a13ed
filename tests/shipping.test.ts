/**
 * Dimensional weight and the shipping box. Rule (UPS help centre, "Determine billable weight"): each dimension rounded to the
 * nearest whole inch (or cm), DIM weight = L × W × H ÷ divisor rounded up to the next whole lb (or kg), billable =
 * max(actual rounded up, DIM rounded up). The worked examples below are computed [C] from those published divisors.
 */
import { describe, expect, it } from 'vitest';
import { dimensionalWeight, G_PER_LB, MM_PER_INCH } from '../shared/shipping/dimensionalWeight';
import { shippingBox } from '../shared/shipping/shippingBox';
import type { DimDivisor } from '../shared/schemas/shipping';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { SalesSettingsSchema } from '../shared/schemas/sales';

const ups: DimDivisor = {
  id: 'ups',
  label: 'UPS',
  unitSystem: 'imperial',
  divisor: 139, // source: UPS "Determine billable weight" help page — 139 in³/lb
  effectiveFrom: '2017-01-01',
  appliesAboveVolume: 0,
  source: '',
};
const metric: DimDivisor = { ...ups, id: 'metric', unitSystem: 'metric', divisor: 5000 }; // source: UPS metric page — cm ÷ 5000
const usps: DimDivisor = { ...ups, id: 'usps', divisor: 166, appliesAboveVolume: 1728 }; // source: USPS 166 over 1 ft³ (1,728 in³), USPS dimensional-weight notice

const inch = (n: number) => n * MM_PER_INCH;

describe('dimensionalWeight', () => {
  it('UPS 139 in³/lb: a 12 × 10 × 8 in box is 960 in³ ÷ 139 = 6.91 lb, billed as 7 lb', () => {
    // computed [C]: 960 / 139 = 6.906…, rounded up to 7 lb
    const w = dimensionalWeight([inch(12), inch(10), inch(8)], 1000, ups);
    expect(w.volume).toBe(960);
    expect(w.dimWeightExact).toBeCloseTo(960 / 139, 9);
    expect(w.dimWeight).toBe(7);
    expect(w.actualWeight).toBe(3); // 1000 g = 2.20 lb, rounded up to 3 lb
    expect(w.billableWeight).toBe(7);
    expect(w.weightUnit).toBe('lb');
  });

  it('rounds each dimension to the nearest whole inch before multiplying (UPS billable-weight rule)', () => {
    const w = dimensionalWeight([inch(12.4), inch(10.5), inch(7.6)], 100, ups);
    expect(w.roundedDimensions).toEqual([12, 11, 8]);
    expect(w.dimWeight).toBe(Math.ceil((12 * 11 * 8) / 139)); // 1056 / 139 = 7.6 -> 8
  });

  it('metric 5000 cm³/kg: 40 × 30 × 20 cm is 24,000 cm³ ÷ 5000 = 4.8 kg, billed as 5 kg', () => {
    // computed [C] from the UPS metric rule (UPS / USPS dimensional-weight pages)
    const w = dimensionalWeight([400, 300, 200], 5200, metric);
    expect(w.volume).toBe(24_000);
    expect(w.dimWeightExact).toBeCloseTo(4.8, 9);
    expect(w.dimWeight).toBe(5);
    expect(w.actualWeight).toBe(6); // 5.2 kg rounded up: the heavier figure bills
    expect(w.billableWeight).toBe(6);
    expect(w.weightUnit).toBe('kg');
  });

  it('USPS applies DIM weight only above 1 ft³ (1,728 in³)', () => {
    // source: USPS divisor 166 for parcels > 1,728 in³ (UPS / USPS dimensional-weight pages)
    const small = dimensionalWeight([inch(11), inch(11), inch(11)], 500, usps);
    expect(small.volume).toBe(1331);
    expect(small.dimWeight).toBe(0);
    expect(small.billableWeight).toBe(2); // 500 g = 1.10 lb -> 2 lb
    const large = dimensionalWeight([inch(13), inch(13), inch(13)], 500, usps);
    expect(large.dimWeight).toBe(Math.ceil(2197 / 166)); // 13.2 -> 14 lb
  });

  it('139 in³/lb is the same rule as about 5,022 cm³/kg (computed)', () => {
    const cm3PerIn3 = (MM_PER_INCH / 10) ** 3;
    const kgPerLb = G_PER_LB / 1000;
    expect((139 * cm3PerIn3) / kgPerLb).toBeCloseTo(5022, -1);
  });
});

describe('shippingBox', () => {
  it('pads, rounds each inside dimension up to the box step, sorts largest first and adds two boards', () => {
    const box = shippingBox([190, 165, 244], 735, {
      paddingMm: 20,
      boxStepMm: 10,
      boardThicknessMm: 4,
      boardGsm: 550,
      fillMassG: 40,
    });
    expect(box.innerMm).toEqual([290, 230, 210]); // 284 -> 290, 230 -> 230, 205 -> 210
    expect(box.outerMm).toEqual([298, 238, 218]);
    const areaM2 = (2 * (298 * 238 + 298 * 218 + 238 * 218)) / 1e6;
    expect(box.packagingMassG).toBeCloseTo(areaM2 * 550 + 40, 6);
    expect(box.actualMassG).toBeCloseTo(735 + box.packagingMassG, 6);
  });
});

describe('default sales settings', () => {
  it('are valid and carry each divisor with the date it took effect', () => {
    const settings = SalesSettingsSchema.parse(DEFAULT_SALES_SETTINGS);
    const byId = new Map(settings.dimDivisors.map((d) => [d.id, d]));
    expect(byId.get('ups-fedex-us')?.divisor).toBe(139); // UPS / USPS dimensional-weight pages
    expect(byId.get('metric-5000')?.divisor).toBe(5000); // UPS / USPS dimensional-weight pages
    expect(byId.get('usps')?.effectiveFrom).toBe('2019-06-23'); // USPS 194 -> 166 on 23 June 2019, UPS / USPS dimensional-weight pages
    for (const d of settings.dimDivisors) expect(d.effectiveFrom).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });
});
