/** Temperatures as people read them. */
import { celsiusToFahrenheit } from './units';

/**
 * A temperature in degrees Celsius with Fahrenheit beside it: `82.0 °C (180 °F)`.
 * @param c - temperature, °C
 * @param cDigits - decimals for Celsius (default 1)
 */
export function formatCelsiusFahrenheit(c: number, cDigits = 1): string {
  return `${c.toFixed(cDigits)} °C (${celsiusToFahrenheit(c).toFixed(0)} °F)`;
}
