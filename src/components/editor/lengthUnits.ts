/** Millimetres in one inch (exact by definition). */
export const MM_PER_INCH = 25.4;

/**
 * A length parameter's value as shown: millimetres, or inches when the designer chose inches.
 * @param valueMm - the value in millimetres
 * @param display - how lengths are shown
 */
export function toDisplayLength(valueMm: number, display: 'mm' | 'in'): number {
  return display === 'in' ? valueMm / MM_PER_INCH : valueMm;
}

/**
 * A shown length converted back to millimetres, rounded to 0.01 mm so inch input does not leave float dust.
 * @param shown - the value as typed or dragged
 * @param display - how lengths are shown
 */
export function fromDisplayLength(shown: number, display: 'mm' | 'in'): number {
  const mm = display === 'in' ? shown * MM_PER_INCH : shown;
  return Math.round(mm * 100) / 100;
}

/**
 * Formats a millimetre length for a label in the chosen display unit.
 * @param valueMm - the value in millimetres
 * @param display - how lengths are shown
 * @param mmDecimals - decimals for millimetres (inches get two more)
 */
export function formatLength(valueMm: number, display: 'mm' | 'in', mmDecimals = 1): string {
  return display === 'in'
    ? `${(valueMm / MM_PER_INCH).toFixed(mmDecimals + 2)} in`
    : `${valueMm.toFixed(mmDecimals)} mm`;
}
