import { fitPartSizes } from './fitParts';

/** Where one part of a unit goes: which plate, and the front-left corner of its footprint on that plate. */
export interface PartPlacement {
  /** Index of the part, in part order. */
  partIndex: number;
  /** Plate number, 0 first: 0 for every part when the parts go together, the part's index when separate. */
  plate: number;
  /** Front-left corner of the part's footprint on its plate, mm from the plate's corner. */
  xMm: number;
  yMm: number;
  /** True when the part is turned 90° about z to fit (its x and y sizes swap). */
  turned: boolean;
}

/** How one unit's parts are laid on build plates. */
export interface PlateLayout {
  /** Together on one plate, each part on a plate of its own, or a part too big for the printer. */
  layout: 'together' | 'separate' | 'none';
  /** Plates one unit needs. */
  plates: number;
  placements: PartPlacement[];
}

/**
 * Lays the parts of one unit on build plates by the plate rule: every part on one plate when a complete set fits
 * (the same packing {@link fitPartSizes} counts sets with: rows of footprints with a gap, deepest first, the whole
 * set centred on the plate), otherwise each part centred on a plate of its own (turned 90° about z when only that
 * fits). A part larger than the printer gets a plate of its own at the corner and the layout says `none`.
 * @param sizesMm - each part's [x, y, z] size in build orientation
 * @param buildVolumeMm - printer build volume [x, y, z]
 * @param spacingMm - gap between parts (10 mm: common practice, no source)
 */
export function layoutUnitOnPlates(
  sizesMm: ReadonlyArray<readonly number[]>,
  buildVolumeMm: readonly number[],
  spacingMm = 10,
): PlateLayout {
  const fit = fitPartSizes(sizesMm, buildVolumeMm, spacingMm);
  const [bx, by] = buildVolumeMm;
  if (!fit.fits) {
    return {
      layout: 'none',
      plates: sizesMm.length,
      placements: sizesMm.map((_, i) => ({ partIndex: i, plate: i, xMm: 0, yMm: 0, turned: false })),
    };
  }
  if (fit.setsPerPlate > 0) {
    for (const turned of [false, true]) {
      const packed = packOneSet(sizesMm, bx, by, spacingMm, turned);
      if (packed) return { layout: 'together', plates: 1, placements: packed };
    }
  }
  return {
    layout: 'separate',
    plates: sizesMm.length,
    placements: sizesMm.map((size, i) => {
      const turned = size[0] > bx || size[1] > by;
      const [w, d] = turned ? [size[1], size[0]] : [size[0], size[1]];
      return { partIndex: i, plate: i, xMm: (bx - w) / 2, yMm: (by - d) / 2, turned };
    }),
  };
}

/** Rows of footprints, deepest first, then the whole set centred on the plate; null when the set does not fit. */
function packOneSet(
  sizesMm: ReadonlyArray<readonly number[]>,
  bx: number,
  by: number,
  gap: number,
  turned: boolean,
): PartPlacement[] | null {
  const eps = 1e-9;
  const order = sizesMm
    .map((size, i) => ({ i, w: turned ? size[1] : size[0], d: turned ? size[0] : size[1] }))
    .sort((a, b) => b.d - a.d || b.w - a.w);
  const placed: PartPlacement[] = [];
  let x = 0;
  let rowY = 0;
  let rowDepth = 0;
  let usedX = 0;
  for (const part of order) {
    if (x > 0 && x + part.w > bx + eps) {
      rowY += rowDepth + gap;
      x = 0;
      rowDepth = 0;
    }
    if (x + part.w > bx + eps || rowY + part.d > by + eps) return null;
    placed.push({ partIndex: part.i, plate: 0, xMm: x, yMm: rowY, turned });
    usedX = Math.max(usedX, x + part.w);
    x += part.w + gap;
    rowDepth = Math.max(rowDepth, part.d);
  }
  const usedY = rowY + rowDepth;
  const dx = (bx - usedX) / 2;
  const dy = (by - usedY) / 2;
  return placed.map((p) => ({ ...p, xMm: p.xMm + dx, yMm: p.yMm + dy })).sort((a, b) => a.partIndex - b.partIndex);
}
