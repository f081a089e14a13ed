import type { IndexedMesh } from '../schemas/mesh';
import { FACE_VECTOR_LENGTH, faceVectors } from './faceVectors';
import type { TriangleBvh } from './TriangleBvh';

/** Thinnest wall found by the inward rays. */
export interface ThinWall {
  minMm: number;
  p5Mm: number;
  atMm: [number, number, number];
  samples: number;
}

/**
 * Wall thickness by rays: points are sampled on the surface in proportion to face area (a fixed low-discrepancy
 * pattern, so results are deterministic), and from each a ray goes inward along the face's -normal to the opposite
 * surface. The distance is the local wall thickness. Knife edges and acute corners give small values by nature, so
 * the 5th percentile is reported beside the minimum.
 * @param mesh - a closed mesh, outward normals
 * @param bvh - the mesh's BVH
 * @param surfaceAreaMm2 - total area (for the sample density)
 * @param maxSamples - sample budget
 * @returns the thinnest wall, or null when no ray found an opposite surface (open mesh)
 */
export function thinnestWall(
  mesh: IndexedMesh,
  bvh: TriangleBvh,
  surfaceAreaMm2: number,
  maxSamples = 20_000,
): ThinWall | null {
  const p = mesh.positions;
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  if (triangles === 0 || surfaceAreaMm2 <= 0) return null;
  const perMm2 = maxSamples / surfaceAreaMm2;
  const thickness: number[] = [];
  let minMm = Infinity;
  let at: [number, number, number] = [0, 0, 0];
  let carry = 0.5; // error diffusion, so small faces still get their share of samples
  let sequence = 0;
  const face = new Float64Array(FACE_VECTOR_LENGTH);
  for (let t = 0; t < triangles; t++) {
    const len = faceVectors(p, idx, t, face);
    if (len === 0) continue;
    const a = idx[t * 3] * 3;
    const ux = face[0],
      uy = face[1],
      uz = face[2];
    const vx = face[3],
      vy = face[4],
      vz = face[5];
    const nx = face[6],
      ny = face[7],
      nz = face[8];
    carry += (len / 2) * perMm2;
    const count = Math.floor(carry);
    carry -= count;
    for (let s = 0; s < count; s++) {
      // R2 low-discrepancy sequence folded into the triangle
      sequence++;
      let r1 = (0.5 + sequence * 0.7548776662466927) % 1;
      let r2 = (0.5 + sequence * 0.5698402909980532) % 1;
      if (r1 + r2 > 1) {
        r1 = 1 - r1;
        r2 = 1 - r2;
      }
      const x = p[a] + r1 * ux + r2 * vx;
      const y = p[a + 1] + r1 * uy + r2 * vy;
      const z = p[a + 2] + r1 * uz + r2 * vz;
      const hit = bvh.raycast(x, y, z, -nx / len, -ny / len, -nz / len, 1e-4, t);
      if (!hit) continue;
      thickness.push(hit.distanceMm);
      if (hit.distanceMm < minMm) {
        minMm = hit.distanceMm;
        at = [x, y, z];
      }
    }
  }
  if (thickness.length === 0) return null;
  thickness.sort((x, y) => x - y);
  const p5Mm = thickness[Math.floor(0.05 * (thickness.length - 1))];
  return { minMm, p5Mm, atMm: at, samples: thickness.length };
}
