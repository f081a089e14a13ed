/** How measures read on documents: millimetres first, inches beside them (1 in = 25.4 mm exactly). */

const MM_PER_INCH = 25.4;
const G_PER_LB = 453.59237;

/**
 * A length in millimetres and inches, e.g. `32 mm (1.26 in)`.
 * @param mm - the length
 * @param mmDigits - decimals for millimetres (default: 0, or 1 under 100 mm when not whole)
 */
export function mmIn(mm: number, mmDigits?: number): string {
  return `${fmtMm(mm, mmDigits)} mm (${inches(mm)} in)`;
}

/**
 * Three lengths as `a × b × c mm (x × y × z in)`.
 * @param mm - the lengths
 */
export function mmInTriple(mm: readonly number[]): string {
  return `${mm.map((v) => fmtMm(v, 0)).join(' × ')} mm (${mm.map(inches).join(' × ')} in)`;
}

/**
 * A mass in grams (or kilograms from 1 kg) and pounds, e.g. `612 g (1.35 lb)`.
 * @param g - the mass
 */
export function massGLb(g: number): string {
  const metric = g >= 1000 ? `${(g / 1000).toFixed(2)} kg` : `${Math.round(g)} g`;
  return `${metric} (${(g / G_PER_LB).toFixed(2)} lb)`;
}

/**
 * Money from whole cents in the currency's own sign, e.g. `€12.40`.
 * @param cents - amount in cents
 * @param currency - ISO 4217 code
 */
export function money(cents: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(cents / 100);
}

/**
 * A temperature in degrees Celsius and Fahrenheit (°F = °C × 9/5 + 32), e.g. `82.0 °C (180 °F)`.
 * @param c - the temperature, °C
 * @param cDigits - decimals for Celsius (default 1)
 */
export function celsiusFahrenheit(c: number, cDigits = 1): string {
  return `${c.toFixed(cDigits)} °C (${((c * 9) / 5 + 32).toFixed(0)} °F)`;
}

/** Inches with two decimals. @param mm - the length in millimetres */
export function inches(mm: number): string {
  return (mm / MM_PER_INCH).toFixed(2);
}

function fmtMm(mm: number, digits?: number): string {
  const d = digits ?? (mm < 100 && Math.abs(mm - Math.round(mm)) > 0.05 ? 1 : 0);
  return mm.toFixed(d);
}
