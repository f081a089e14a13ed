/**
 * Lengths as people read them: millimetres inside the product, inches when asked for or beside them on documents.
 *
 * One inch rule everywhere (screens, editor fields, help texts, documents): an inch figure carries two more
 * decimals than the millimetre figure it stands for. 0.01 in is 0.254 mm, so two more decimals always say the
 * length a little finer than the millimetres did (32 mm → 1.26 in, 32.0 mm → 1.260 in), and never claim much more.
 */
import { MM_PER_INCH } from './units';

/** How a screen shows lengths. */
export type LengthUnit = 'mm' | 'in';

/** Decimals an inch figure carries beyond the millimetre figure it stands for. */
export const INCH_EXTRA_DECIMALS = 2;

/**
 * Decimals for inches that stand for millimetres written with `mmDecimals` decimals.
 * @param mmDecimals - decimals of the millimetre figure
 */
export function inchDecimals(mmDecimals: number): number {
  return mmDecimals + INCH_EXTRA_DECIMALS;
}

/**
 * Inches without the unit, by the one inch rule: `1.26` for 32 mm, `1.260` for 32.0 mm.
 * @param mm - length in millimetres
 * @param mmDecimals - decimals the same length has in millimetres (default 0)
 */
export function inches(mm: number, mmDecimals = 0): string {
  return (mm / MM_PER_INCH).toFixed(inchDecimals(mmDecimals));
}

/**
 * The decimals a figure is written with (`32` → 0, `0.60` → 2), so its inches can follow the one inch rule.
 * @param figure - a number as written, or a number (then as JavaScript writes it)
 */
export function writtenDecimals(figure: string | number): number {
  const text = String(figure);
  const dot = text.indexOf('.');
  return dot < 0 ? 0 : text.length - dot - 1;
}

/**
 * A length in the chosen unit: `32.0 mm` or `1.260 in`.
 * @param mm - length in millimetres
 * @param unit - how lengths are shown
 * @param mmDecimals - decimals for millimetres (inches get two more)
 */
export function formatLength(mm: number, unit: LengthUnit, mmDecimals = 1): string {
  return unit === 'in' ? `${inches(mm, mmDecimals)} in` : `${mm.toFixed(mmDecimals)} mm`;
}

function millimetreDecimals(mm: number, digits?: number): number {
  return digits ?? (mm < 100 && Math.abs(mm - Math.round(mm)) > 0.05 ? 1 : 0);
}

/**
 * A length in millimetres with inches beside it: `32 mm (1.26 in)`, `28.5 mm (1.122 in)`.
 * @param mm - the length
 * @param mmDigits - decimals for millimetres (default: 0, or 1 under 100 mm when not whole)
 */
export function formatMmIn(mm: number, mmDigits?: number): string {
  const d = millimetreDecimals(mm, mmDigits);
  return `${mm.toFixed(d)} mm (${inches(mm, d)} in)`;
}

/**
 * Three lengths as `a × b × c mm (x × y × z in)`.
 * @param mm - the lengths
 */
export function formatMmInTriple(mm: readonly number[]): string {
  return `${mm.map((v) => v.toFixed(0)).join(' × ')} mm (${mm.map((v) => inches(v, 0)).join(' × ')} in)`;
}

/**
 * Lengths joined by `×` in one unit, e.g. a bounding box: `246 × 238 × 262 mm` or `9.69 × 9.37 × 10.31 in`.
 * @param mm - the lengths in millimetres
 * @param unit - how lengths are shown
 */
export function formatSize(mm: readonly number[], unit: LengthUnit): string {
  return unit === 'in'
    ? `${mm.map((v) => inches(v, 0)).join(' × ')} in`
    : `${mm.map((v) => v.toFixed(0)).join(' × ')} mm`;
}
