import type { Outline } from './Solid';

/** An egg outline in the (r, z) half plane: two half ellipses meeting at the equator z = 0. */
export interface EggProfileOptions {
  /** Equator radius. */
  radiusMm: number;
  /** Upper semi-axis (equator to top). */
  upperMm: number;
  /** Lower semi-axis (equator to the would-be bottom). */
  lowerMm: number;
  /** The outline is cut flat at this height (below the equator, so negative). */
  cutZMm: number;
  /** Points per quarter ellipse. */
  steps: number;
  /** Replace the top by a 45° cone where the ellipse is flatter than 45° (a ceiling that needs no support). */
  coneTop: boolean;
  /** Replace the bottom by a 45° cone where the ellipse is flatter than 45° (an underside that needs no support). */
  coneBottom: boolean;
}

/** Radius of the ellipse (semi-axes a across, b up) at height z, 0 outside it. */
function ellipseRadius(a: number, b: number, z: number): number {
  const k = 1 - (z / b) ** 2;
  return k > 0 ? a * Math.sqrt(k) : 0;
}

/**
 * The region between the axis and an egg outline, cut flat at `cutZMm`, as a counter-clockwise (r, z) outline ready
 * to revolve. Where requested, the parts of the curve flatter than 45° are replaced by 45° cones, so the solid (or
 * the cavity) prints upright without support. source: 45° self-supporting rule, Mazlan et al., J. Adv. Ind. Tech. & Appl. (UTHM), 2020.
 * @param options - sizes and where to use cones
 */
export function eggProfile(options: EggProfileOptions): Outline {
  const { radiusMm: a, upperMm: bu, lowerMm: bl, cutZMm: zc, steps } = options;
  const points: Outline = [];
  // Lower quarter: where the slope is exactly 45° (tan φ = b / a), measured from the equator.
  const lowPhi = Math.atan(bl / a);
  const lowTangent: [number, number] = [a * Math.cos(lowPhi), -bl * Math.sin(lowPhi)];
  const cutRadius = ellipseRadius(a, bl, zc);
  if (options.coneBottom && zc < lowTangent[1]) {
    points.push([0, zc], [lowTangent[0] - (lowTangent[1] - zc), zc], lowTangent);
    for (let i = 1; i <= steps; i++) {
      const phi = lowPhi * (1 - i / steps);
      points.push([a * Math.cos(phi), -bl * Math.sin(phi)]);
    }
  } else {
    points.push([0, zc], [cutRadius, zc]);
    const startPhi = Math.asin(Math.min(1, -zc / bl));
    for (let i = 1; i <= steps; i++) {
      const phi = startPhi * (1 - i / steps);
      points.push([a * Math.cos(phi), -bl * Math.sin(phi)]);
    }
  }
  // Upper quarter from the equator up.
  const highPhi = options.coneTop ? Math.atan(bu / a) : Math.PI / 2;
  for (let i = 1; i <= steps; i++) {
    const phi = (highPhi * i) / steps;
    const r = a * Math.cos(phi);
    if (r < 1e-6) break;
    points.push([r, bu * Math.sin(phi)]);
  }
  const last = points[points.length - 1];
  points.push([0, options.coneTop ? last[1] + last[0] : bu]);
  return points;
}

/**
 * Height of the upper part of {@link eggProfile} (cone top) at radius r, for placing holes below the ceiling.
 * @param options - the same options the profile was made with (coneTop true)
 * @param r - distance from the axis
 */
export function eggCeilingZ(options: Pick<EggProfileOptions, 'radiusMm' | 'upperMm'>, r: number): number {
  const a = options.radiusMm;
  const b = options.upperMm;
  const phi = Math.atan(b / a);
  const tangentR = a * Math.cos(phi);
  const tangentZ = b * Math.sin(phi);
  if (r <= tangentR) return tangentZ + tangentR - r;
  return r >= a ? 0 : b * Math.sqrt(1 - (r / a) ** 2);
}
