/** Lengths as people read them: millimetres inside the product, inches when asked for or beside them on documents. */
import { MM_PER_INCH } from './units';

/** How a screen shows lengths. */
export type LengthUnit = 'mm' | 'in';

/**
 * A length in the chosen unit: `32.0 mm` or `1.260 in` (inches get two more decimals than millimetres).
 * @param mm - length in millimetres
 * @param unit - how lengths are shown
 * @param mmDecimals - decimals for millimetres
 */
export function formatLength(mm: number, unit: LengthUnit, mmDecimals = 1): string {
  return unit === 'in' ? `${(mm / MM_PER_INCH).toFixed(mmDecimals + 2)} in` : `${mm.toFixed(mmDecimals)} mm`;
}

/**
 * Inches with two decimals, without the unit.
 * @param mm - length in millimetres
 */
export function inches(mm: number): string {
  return (mm / MM_PER_INCH).toFixed(2);
}

function millimetres(mm: number, digits?: number): string {
  const d = digits ?? (mm < 100 && Math.abs(mm - Math.round(mm)) > 0.05 ? 1 : 0);
  return mm.toFixed(d);
}

/**
 * A length in millimetres with inches beside it: `32 mm (1.26 in)`.
 * @param mm - the length
 * @param mmDigits - decimals for millimetres (default: 0, or 1 under 100 mm when not whole)
 */
export function formatMmIn(mm: number, mmDigits?: number): string {
  return `${millimetres(mm, mmDigits)} mm (${inches(mm)} in)`;
}

/**
 * Three lengths as `a × b × c mm (x × y × z in)`.
 * @param mm - the lengths
 */
export function formatMmInTriple(mm: readonly number[]): string {
  return `${mm.map((v) => millimetres(v, 0)).join(' × ')} mm (${mm.map(inches).join(' × ')} in)`;
}

/**
 * Lengths joined by `×` in one unit, e.g. a bounding box: `246 × 238 × 262 mm` or `9.69 × 9.37 × 10.31 in`.
 * @param mm - the lengths in millimetres
 * @param unit - how lengths are shown
 */
export function formatSize(mm: readonly number[], unit: LengthUnit): string {
  return unit === 'in'
    ? `${mm.map((v) => (v / MM_PER_INCH).toFixed(2)).join(' × ')} in`
    : `${mm.map((v) => v.toFixed(0)).join(' × ')} mm`;
}
