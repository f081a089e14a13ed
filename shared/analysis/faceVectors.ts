/** Number of values {@link faceVectors} writes: edge u, edge v and the normal, three each. */
export const FACE_VECTOR_LENGTH = 9;

/**
 * Edge vectors and unnormalised normal of one triangle: u = b − a, v = c − a, n = u × v (pointing outward for
 * counter-clockwise corners), written into `out` as [ux, uy, uz, vx, vy, vz, nx, ny, nz] so hot loops allocate nothing.
 * @param positions - vertex coordinates, x y z per vertex
 * @param indices - three vertex indices per triangle
 * @param t - triangle index
 * @param out - receives the nine values (length ≥ {@link FACE_VECTOR_LENGTH})
 * @returns |n|, twice the triangle's area in mm²
 */
export function faceVectors(
  positions: ArrayLike<number>,
  indices: ArrayLike<number>,
  t: number,
  out: Float64Array,
): number {
  const p = positions;
  const a = indices[t * 3] * 3,
    b = indices[t * 3 + 1] * 3,
    c = indices[t * 3 + 2] * 3;
  const ux = p[b] - p[a],
    uy = p[b + 1] - p[a + 1],
    uz = p[b + 2] - p[a + 2];
  const vx = p[c] - p[a],
    vy = p[c + 1] - p[a + 1],
    vz = p[c + 2] - p[a + 2];
  const nx = uy * vz - uz * vy,
    ny = uz * vx - ux * vz,
    nz = ux * vy - uy * vx;
  out[0] = ux;
  out[1] = uy;
  out[2] = uz;
  out[3] = vx;
  out[4] = vy;
  out[5] = vz;
  out[6] = nx;
  out[7] = ny;
  out[8] = nz;
  return Math.sqrt(nx * nx + ny * ny + nz * nz);
}
