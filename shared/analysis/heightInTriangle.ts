/**
 * Height of a triangle above the point (x, y) seen from above, by barycentric weights of the point in the triangle's
 * projection onto the x-y plane.
 * @param positions - vertex coordinates, x y z per vertex
 * @param a - offset of the first corner in `positions` (vertex index × 3)
 * @param b - offset of the second corner
 * @param c - offset of the third corner
 * @param areaX2 - twice the signed projected area, `(bx - ax)(cy - ay) - (by - ay)(cx - ax)`
 * @param x - the point's x, mm
 * @param y - the point's y, mm
 * @returns z of the triangle above (x, y) in mm, or NaN when the point lies outside the projection
 */
export function heightInTriangle(
  positions: ArrayLike<number>,
  a: number,
  b: number,
  c: number,
  areaX2: number,
  x: number,
  y: number,
): number {
  const p = positions;
  const w0 = ((p[b] - x) * (p[c + 1] - y) - (p[b + 1] - y) * (p[c] - x)) / areaX2;
  if (w0 < 0) return NaN;
  const w1 = ((p[c] - x) * (p[a + 1] - y) - (p[c + 1] - y) * (p[a] - x)) / areaX2;
  if (w1 < 0) return NaN;
  const w2 = 1 - w0 - w1;
  if (w2 < 0) return NaN;
  return w0 * p[a + 2] + w1 * p[b + 2] + w2 * p[c + 2];
}
