/**
 * The reasons a variant row gives are written in the units and names a person sees on the same screen: the support
 * volume in cm³ like the family's support budget (one unit per quantity on a screen), the printer by its name, not
 * its id. 1 cm³ = 1,000 mm³ (source: BIPM, "The International System of Units (SI)", 9th edition, 2019).
 */
import { describe, expect, it } from 'vitest';
import { variantVerdict } from '../shared/families/variantVerdict';
import { formatCm3 } from '../shared/families/formatCm3';

const SOUND = { watertight: true, openEdges: 0, nonManifoldEdges: 0, fitsPrinter: true, printerId: 'workhorse-220' };

describe('variant reasons', () => {
  it('state an over-budget support volume in cm³, the budget’s unit', () => {
    const { verdict, reasons } = variantVerdict({ ...SOUND, supportVolumeMm3: 12_345 }, 5_000, []);
    expect(verdict).toBe('fail');
    expect(reasons).toEqual(['support 12.3 cm³ is over the family budget of 5.0 cm³']);
    expect(reasons.join(' ')).not.toContain('mm³');
  });

  it('name the printer a part does not fit by its name', () => {
    const { reasons } = variantVerdict(
      { ...SOUND, fitsPrinter: false, supportVolumeMm3: 0 },
      5_000,
      [],
      'PLA',
      'Alder tall 0.6 mm',
    );
    expect(reasons).toEqual(['a part does not fit the build volume of the Alder tall 0.6 mm']);
  });
});

describe('formatCm3', () => {
  it('writes mm³ as cm³: one decimal, two below 1 cm³, thousands grouped', () => {
    expect(formatCm3(12_500)).toBe('12.5 cm³');
    expect(formatCm3(80)).toBe('0.08 cm³');
    expect(formatCm3(1_234_000)).toBe('1,234.0 cm³');
    expect(formatCm3(0)).toBe('0.00 cm³');
  });
});
