import type { IndexedMesh } from '../../shared/schemas/mesh';

/**
 * Enclosed volume of a closed, outward-wound mesh by the divergence theorem (sum of signed tetrahedra), mm³.
 * @param mesh - a closed mesh in millimetres
 */
export function meshVolumeMm3(mesh: IndexedMesh): number {
  const p = mesh.positions;
  const idx = mesh.indices;
  let sixTimes = 0;
  for (let t = 0; t < idx.length; t += 3) {
    const a = idx[t] * 3;
    const b = idx[t + 1] * 3;
    const c = idx[t + 2] * 3;
    sixTimes +=
      p[a] * (p[b + 1] * p[c + 2] - p[b + 2] * p[c + 1]) -
      p[a + 1] * (p[b] * p[c + 2] - p[b + 2] * p[c]) +
      p[a + 2] * (p[b] * p[c + 1] - p[b + 1] * p[c]);
  }
  return sixTimes / 6;
}
