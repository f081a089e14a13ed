import { Solid, type Outline } from './Solid';

/** How far a shingle plate stands proud of the roof, perpendicular to it. */
export const SHINGLE_PROUD_MM = 1.5;
const ROW_MM = 18;
const GAP_MM = 2;

/** Where shingle rows go on a pair of roof planes symmetric about x = 0, ridge along y. */
export interface ShingleRowsOptions {
  /** Distance from the centre line where the first (highest) row starts. */
  fromXMm: number;
  /** Distance from the centre line where the roof ends (the eave). */
  toXMm: number;
  /** Height of the outer roof surface at distance |x| from the centre line. */
  outerZ: (x: number) => number;
  pitchDeg: number;
  fromYMm: number;
  toYMm: number;
  /** Draft: one plain slab per roof plane instead of separate rows (same outside, far fewer faces). */
  slabs?: boolean;
}

/**
 * Shingle rows on both roof planes: plates standing {@link SHINGLE_PROUD_MM} proud of the roof with vertical ends,
 * so every face is either at the roof pitch or vertical and nothing needs support whichever way up the roof prints
 * (as long as the pitch itself is 45° or steeper).
 * @param options - placement of the rows
 */
export function shingleRows(options: ShingleRowsOptions): Solid[] {
  return shingleOutlines(options).map((plate) => Solid.prism(plate, 'y', options.fromYMm, options.toYMm));
}

/**
 * The cross-sections of {@link shingleRows} in the (x, z) plane, two per row (one each side), for callers that
 * join them with other sections in 2D before extruding.
 * @param options - placement of the rows
 */
export function shingleOutlines(options: ShingleRowsOptions): Outline[] {
  const rise = SHINGLE_PROUD_MM / Math.cos((options.pitchDeg * Math.PI) / 180);
  const plates: Outline[] = [];
  let x0 = options.fromXMm;
  while (x0 + 4 < options.toXMm) {
    const x1 = options.slabs ? options.toXMm : Math.min(x0 + ROW_MM, options.toXMm);
    const plate: Outline = [
      [x0, options.outerZ(x0) - 0.3],
      [x1, options.outerZ(x1) - 0.3],
      [x1, options.outerZ(x1) + rise],
      [x0, options.outerZ(x0) + rise],
    ];
    const mirrored = plate.map(([u, v]): [number, number] => [-u, v]).reverse();
    plates.push(plate, mirrored);
    x0 = x1 + GAP_MM;
  }
  return plates;
}
