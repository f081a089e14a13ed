import type { Outline } from './Solid';

/** How far the flat tip of a teardrop sits from its centre, in radii (a short bridge instead of a sharp point). */
export const TEARDROP_TIP_RADII = 1.15;

/**
 * Outline of a horizontal hole that prints without support: a circle whose upper part runs out in two 45° flanks,
 * truncated flat at {@link TEARDROP_TIP_RADII} radii ("flat teardrop"; source: Zaggo). The tip
 * points to +v (the build direction once placed). Counter-clockwise, centred on the origin.
 * @param diameterMm - diameter of the round part
 * @param segments - points on the full circle
 * @param tipUp - false points the tip to −v (for parts designed upside down and flipped to print)
 * @param tipRadii - where the tip is cut flat, in radii from the centre (√2 gives a sharp point)
 */
export function teardropOutline(
  diameterMm: number,
  segments: number,
  tipUp = true,
  tipRadii = TEARDROP_TIP_RADII,
): Outline {
  const r = diameterMm / 2;
  const tip = Math.min(tipRadii, Math.SQRT2) * r;
  const half = Math.SQRT2 * r - tip;
  const points: Outline = [];
  // Lower arc from 135° round through 270° to 405° (= 45°), counter-clockwise.
  const steps = Math.max(6, Math.round((segments * 3) / 4));
  for (let i = 0; i <= steps; i++) {
    const angle = ((135 + (270 * i) / steps) * Math.PI) / 180;
    points.push([r * Math.cos(angle), r * Math.sin(angle)]);
  }
  if (half > 1e-6) points.push([half, tip], [-half, tip]);
  else points.push([0, tip]);
  // Mirroring v reverses the winding; reverse the list to stay counter-clockwise.
  return tipUp ? points : points.map(([u, v]): [number, number] => [u, -v]).reverse();
}

/**
 * Outline of a vertical ventilation slot with 45° pointed ends (no flat ceiling), centred on the origin.
 * @param widthMm - slot width
 * @param lengthMm - overall slot length, tip to tip (≥ width)
 */
export function slotOutline(widthMm: number, lengthMm: number): Outline {
  const w = widthMm / 2;
  const l = lengthMm / 2;
  return [
    [0, -l],
    [w, -l + w],
    [w, l - w],
    [0, l],
    [-w, l - w],
    [-w, -l + w],
  ];
}

/**
 * Open area of {@link slotOutline}, mm².
 * @param widthMm - slot width
 * @param lengthMm - overall slot length
 */
export function slotAreaMm2(widthMm: number, lengthMm: number): number {
  return widthMm * (lengthMm - widthMm) + (widthMm * widthMm) / 2;
}
