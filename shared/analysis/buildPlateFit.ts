/** Whether a part fits and how many copies go on one plate. */
export interface PlateFit {
  fits: boolean;
  copiesPerPlate: number;
  turnedOnPlate: boolean;
}

/**
 * Fit in the build volume (allowing a 90° turn about z) and copies per plate by grid packing of the part's x-y
 * bounding box with a gap between copies: n = floor((B + s) / (f + s)) per axis.
 * @param sizeMm - part bounding box size in build orientation [x, y, z]
 * @param buildVolumeMm - printer build volume [x, y, z]
 * @param spacingMm - gap between copies (10 mm: common practice, no source)
 * @returns fit, copies and whether the copies are turned
 */
export function buildPlateFit(sizeMm: readonly number[], buildVolumeMm: readonly number[], spacingMm = 10): PlateFit {
  const [fx, fy, fz] = sizeMm;
  const [bx, by, bz] = buildVolumeMm;
  if (fz > bz) return { fits: false, copiesPerPlate: 0, turnedOnPlate: false };
  const count = (w: number, d: number): number =>
    w <= bx && d <= by
      ? Math.floor((bx + spacingMm) / (w + spacingMm)) * Math.floor((by + spacingMm) / (d + spacingMm))
      : 0;
  const straight = count(fx, fy);
  const turned = count(fy, fx);
  if (straight === 0 && turned === 0) return { fits: false, copiesPerPlate: 0, turnedOnPlate: false };
  return { fits: true, copiesPerPlate: Math.max(straight, turned), turnedOnPlate: turned > straight };
}
