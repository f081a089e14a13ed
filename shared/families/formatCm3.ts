/**
 * A volume given in mm³ written in cm³, the unit a family's support budget is set in, so a volume and the budget it
 * is compared with read in one unit: one decimal, two below 1 cm³ (`12.5 cm³`, `0.08 cm³`), grouped thousands.
 * @param volumeMm3 - the volume in mm³
 */
export function formatCm3(volumeMm3: number): string {
  const cm3 = volumeMm3 / 1000;
  const decimals = Math.abs(cm3) < 1 ? 2 : 1;
  return `${cm3.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })} cm³`;
}
