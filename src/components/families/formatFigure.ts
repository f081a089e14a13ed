/**
 * Formats the figures family, review and catalogue screens show: money from cents, volumes, masses, durations.
 * Millimetres inside; the units are written next to the number.
 */

import { formatCm3 } from '../../../shared/families/formatCm3';

/**
 * Money from integer cents, e.g. `$12.40`.
 * @param cents - amount in cents
 * @param currency - ISO 4217 code
 */
export function formatCents(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).format(cents / 100);
}

/**
 * A volume in cm³ from mm³ (`12.5 cm³`, `0.08 cm³`): always cm³, the unit the support budget is set in, so a
 * volume and its budget read in one unit.
 * @param volumeMm3 - volume in cubic millimetres
 */
export function formatVolumeMm3(volumeMm3: number): string {
  return formatCm3(volumeMm3);
}

/**
 * A mass in grams, one decimal.
 * @param massG - mass in grams
 */
export function formatMassG(massG: number): string {
  return `${massG.toFixed(1)} g`;
}

/**
 * A duration from minutes as `3 h 25 min`.
 * @param minutes - duration in minutes
 */
export function formatMinutes(minutes: number): string {
  const rounded = Math.round(minutes);
  const hours = Math.floor(rounded / 60);
  return hours ? `${hours} h ${rounded % 60} min` : `${rounded} min`;
}

/**
 * An axis value as people read it: numbers as written, booleans as yes/no, ids with spaces.
 * @param value - the axis value
 */
export function formatAxisValue(value: unknown): string {
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value.replace(/-/g, ' ');
  return String(value);
}

/**
 * A date and time in the reader's locale, short.
 * @param iso - ISO timestamp
 */
export function formatWhen(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
}

/**
 * An axis value with its unit read from the key's suffix (`entryHoleDiameterMm` 32 -> `32 mm`).
 * @param key - the axis key
 * @param value - the value on that axis
 */
export function formatAxisEntry(key: string, value: unknown): string {
  const text = formatAxisValue(value);
  if (typeof value !== 'number') return text;
  if (key.endsWith('Mm')) return `${text} mm`;
  if (key.endsWith('Deg')) return `${text}°`;
  return text;
}
