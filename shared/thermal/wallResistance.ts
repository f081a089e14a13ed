import { WallResistanceInputSchema, type WallResistance, type WallResistanceInput } from '../schemas/outdoor';

/** Still air near 25 °C (Neutrium 0.0259 at 298 K; Carroll 0.02643 at 25 °C). */
export const AIR_K_WMK = 0.026;
/** Eastern white pine at 12 % moisture (USDA FPL Wood Handbook Table 4-7). */
export const PINE_K_WMK = 0.11;
/** A ¾ in board, the wall thickness North American guidance asks for (Cornell). */
export const PINE_BOARD_MM = 19;
/** Closed cells larger than this may let air circulate (Grabowska & Kasperski 2020: 6 mm where convection can occur). */
export const CONVECTION_CELL_MM = 6;

/**
 * The stated (parallel-path) resistance of {@link wallResistance} as a bare number, without validation or texts:
 * for searches that evaluate it thousands of times.
 * @param wallThicknessMm - wall thickness
 * @param perimeters - perimeters on each face
 * @param lineWidthMm - extrusion line width
 * @param infillPct - core infill density, 0–100
 * @param polymerK - conductivity of the solid polymer, W/m·K
 * @returns R in m²K/W
 */
export function wallResistanceM2KW(
  wallThicknessMm: number,
  perimeters: number,
  lineWidthMm: number,
  infillPct: number,
  polymerK: number,
): number {
  const skinThicknessMm = Math.min(wallThicknessMm, 2 * perimeters * lineWidthMm);
  const fill = infillPct / 100;
  const kParallel = fill * polymerK + (1 - fill) * AIR_K_WMK;
  return skinThicknessMm / 1000 / polymerK + (wallThicknessMm - skinThicknessMm) / 1000 / kParallel;
}

/**
 * Estimated air-cell size of grid-like infill: lines in two directions, so the line spacing is about
 * 2 × line width / density.
 * @param lineWidthMm - extrusion line width
 * @param infillPct - infill density, 0–100 (0 gives Infinity: an open gap)
 * @returns the cell size in mm
 */
export function gridCellSizeMm(lineWidthMm: number, infillPct: number): number {
  return infillPct > 0 ? (2 * lineWidthMm) / (infillPct / 100) : Infinity;
}

/**
 * Thermal resistance of a board of wood as thick as a given number of millimetres, R = t / k, on the same
 * conduction-only basis as a printed wall.
 * @param boardMm - board thickness
 * @param woodK - the wood's conductivity (default: eastern white pine, USDA Wood Handbook Table 4-7)
 * @returns R in m²K/W
 */
export function boardResistanceM2KW(boardMm: number, woodK = PINE_K_WMK): number {
  return boardMm / 1000 / woodK;
}

/**
 * Conductive thermal resistance of a printed wall: solid perimeters on both faces and an infill core of air cells
 * with polymer webs. The core uses the parallel-path model (webs as continuous heat paths across the wall, as
 * rectilinear or grid infill lines are in a printed vertical wall) for the stated value and the series model as an
 * upper bound. Surface films are left out; the pine board is compared on the same basis.
 * @param input - wall thickness, perimeters per face, line width, core infill %, polymer conductivity (W/m·K)
 * @returns R in m²K/W with its bounds, the pine comparison and the model's limits as text
 */
export function wallResistance(input: WallResistanceInput): WallResistance {
  const w = WallResistanceInputSchema.parse(input);
  const skinThicknessMm = Math.min(w.wallThicknessMm, 2 * w.perimeters * w.lineWidthMm);
  const coreThicknessMm = w.wallThicknessMm - skinThicknessMm;
  const fill = w.infillPct / 100;
  const kSeries = 1 / (fill / w.polymerK + (1 - fill) / AIR_K_WMK);
  const skinR = skinThicknessMm / 1000 / w.polymerK;
  const rM2KW = wallResistanceM2KW(w.wallThicknessMm, w.perimeters, w.lineWidthMm, w.infillPct, w.polymerK);
  const rUpperM2KW = skinR + coreThicknessMm / 1000 / kSeries;
  const infillCellSizeMm = coreThicknessMm > 0 && fill > 0 ? gridCellSizeMm(w.lineWidthMm, w.infillPct) : null;
  const pineBoardRM2KW = boardResistanceM2KW(PINE_BOARD_MM);

  const limits = [
    'Conduction only: the inside and outside air films, sunshine, wind and moisture are left out, so compare ' +
      'walls with walls, not with a full heat balance.',
    `Solid polymer k = ${w.polymerK} W/m·K; published values for printed PLA range from 0.12–0.13 to 0.27 W/m·K, ` +
      'and measured printed parts do not always follow porosity models (Laureto et al. 2017).',
    `The core is air (k ${AIR_K_WMK} W/m·K) with polymer webs: the stated value is the parallel-path estimate; ` +
      'the series value is an upper bound that real infill does not reach.',
    'Infill pattern changes the thermal performance of printed walls by up to 70 % (Lopes et al. 2023).',
  ];
  if (coreThicknessMm === 0) {
    limits.push('The wall is all perimeters: no enclosed air cells.');
  } else if (fill === 0) {
    limits.push('With no infill the core is an open air gap in which air can circulate; the figure is optimistic.');
  } else if (infillCellSizeMm !== null && infillCellSizeMm > CONVECTION_CELL_MM) {
    limits.push(
      `Estimated cell size ${infillCellSizeMm.toFixed(1)} mm is above the ${CONVECTION_CELL_MM}–10 mm where air ` +
        'starts to move (Grabowska & Kasperski 2020): convection would lower the resistance.',
    );
  }
  return {
    skinThicknessMm,
    coreThicknessMm,
    infillCellSizeMm,
    rM2KW,
    rUpperM2KW,
    pineBoardRM2KW,
    ratioToPine: rM2KW / pineBoardRM2KW,
    limits,
  };
}
