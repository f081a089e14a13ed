/**
 * Formats the figures family, review and catalogue screens show that the shared format module does not: volumes
 * and axis values. Money, masses, durations and dates come from shared/format.
 */

import { formatCm3 } from '../../../shared/families/formatCm3';

/**
 * A volume in cm³ from mm³ (`12.5 cm³`, `0.08 cm³`): always cm³, the unit the support budget is set in, so a
 * volume and its budget read in one unit.
 * @param volumeMm3 - volume in cubic millimetres
 */
export function formatVolumeMm3(volumeMm3: number): string {
  return formatCm3(volumeMm3);
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
