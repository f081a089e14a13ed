import type { InsulationTarget } from '../schemas/wallRecipe';
import { boardResistanceM2KW, CONVECTION_CELL_MM, gridCellSizeMm, wallResistanceM2KW } from '../thermal/wallResistance';

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

/** A printed side wall's figures for the insulation target. */
export interface WallInsulationFigures {
  /** Conductive R (parallel-path model), m²K/W. */
  wallRM2KW: number;
  /** Air-cell size of the infill core, mm; null when the wall is all perimeters, Infinity for an empty core. */
  wallCellMm: number | null;
  /** Least infill whose cells stay within {@link CONVECTION_CELL_MM} at this line width, %. */
  wallCellInfillPct: number;
}

/**
 * The side wall's R and the air-cell size of its core, as the family gate, the editor's target bars and the
 * wall-recipe optimizer judge it: R by the parallel-path model, and cells above {@link CONVECTION_CELL_MM} (where
 * air starts to move, Grabowska & Kasperski 2020) do not count as still air.
 * @param wallThicknessMm - wall thickness
 * @param perimeters - perimeters on each face
 * @param lineWidthMm - extrusion line width
 * @param infillPct - core infill density, 0–100
 * @param polymerK - conductivity of the solid polymer, W/m·K
 */
export function wallInsulationFigures(
  wallThicknessMm: number,
  perimeters: number,
  lineWidthMm: number,
  infillPct: number,
  polymerK: number,
): WallInsulationFigures {
  const hasCore = wallThicknessMm > 2 * perimeters * lineWidthMm + 1e-9;
  return {
    wallRM2KW: wallResistanceM2KW(wallThicknessMm, perimeters, lineWidthMm, infillPct, polymerK),
    wallCellMm: hasCore ? gridCellSizeMm(lineWidthMm, infillPct) : null,
    wallCellInfillPct: Math.ceil((200 * lineWidthMm) / CONVECTION_CELL_MM),
  };
}
