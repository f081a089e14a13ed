import type { InsulationTarget } from '../schemas/wallRecipe';
import { boardResistanceM2KW } from '../thermal/wallResistance';

/**
 * The conductive R an insulation target asks for: a pine board's t / k (eastern white pine, k 0.11 W/m·K, USDA
 * Forest Products Laboratory, Wood Handbook, Table 4-7), or the R value given.
 * @param target - the insulation target
 * @returns R in m²K/W
 */
export function insulationTargetRM2KW(target: InsulationTarget): number {
  return target.kind === 'pine-board' ? boardResistanceM2KW(target.boardMm) : target.rM2KW;
}

/**
 * The target in words, e.g. "at least as good as 19 mm pine (R 0.173 m²K/W)".
 * @param target - the insulation target
 */
export function describeInsulationTarget(target: InsulationTarget): string {
  const r = insulationTargetRM2KW(target).toFixed(3);
  return target.kind === 'pine-board'
    ? `at least as good as ${target.boardMm} mm pine (R ${r} m²K/W)`
    : `R at least ${r} m²K/W`;
}
