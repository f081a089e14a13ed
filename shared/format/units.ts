/**
 * Unit constants and conversions used across the product. Both factors are exact by definition: the international
 * yard and pound agreement (1959) fixes 1 in = 25.4 mm and 1 lb = 0.453 592 37 kg.
 */

/** Millimetres in one inch (exact). */
export const MM_PER_INCH = 25.4;

/** Grams in one avoirdupois pound (exact). */
export const G_PER_LB = 453.59237;

/**
 * Degrees Fahrenheit from degrees Celsius (°F = °C × 9/5 + 32).
 * @param c - temperature, °C
 */
export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}

/**
 * Degrees Celsius from degrees Fahrenheit (°C = (°F − 32) × 5/9).
 * @param f - temperature, °F
 */
export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}
