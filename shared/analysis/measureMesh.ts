import type { IndexedMesh } from '../schemas/mesh';

/** Faces whose corners all lie within this height of the plate count as resting on it (common practice, no source). */
export const PLATE_TOLERANCE_MM = 0.05;

/** Faces steeper than this from vertical, facing down, need support (the common default; common practice). */
export const DEFAULT_OVERHANG_DEG = 45;

/** Results of the single linear pass over the triangles. */
export interface MeshMeasures {
  triangles: number;
  volumeMm3: number;
  surfaceAreaMm2: number;
  upFacingAreaMm2: number;
  downFacingAreaMm2: number;
  minMm: [number, number, number];
  maxMm: [number, number, number];
  overhangAreaMm2: number;
  overhangFaceCount: number;
  /** 1 per overhang triangle, 0 otherwise. */
  overhangMask: Uint8Array;
  bedContactAreaMm2: number;
}

/**
 * One pass over the triangles: signed volume (divergence theorem), area, bounds, up/down-facing area, overhang and
 * bed contact. A face is an overhang when it faces down more steeply than `overhangDeg` from vertical, i.e. its unit
 * normal has n_z < -sin(overhangDeg); faces lying on the plate are not overhangs, they are bed contact.
 * @param mesh - the part in build orientation (resting on z = 0)
 * @param overhangDeg - threshold in degrees from vertical (45 is the common default)
 * @returns the measures
 */
export function measureMesh(mesh: IndexedMesh, overhangDeg = DEFAULT_OVERHANG_DEG): MeshMeasures {
  const p = mesh.positions;
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const overhangMask = new Uint8Array(triangles);
  const sinLimit = Math.sin((overhangDeg * Math.PI) / 180);
  const contactCos = Math.cos((1 * Math.PI) / 180);
  let minX = Infinity;
  let minY = Infinity;
  let minZ = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  let maxZ = -Infinity;
  for (let i = 0; i < p.length; i += 3) {
    const x = p[i];
    const y = p[i + 1];
    const z = p[i + 2];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
    if (z < minZ) minZ = z;
    if (z > maxZ) maxZ = z;
  }
  const plateZ = minZ + PLATE_TOLERANCE_MM;
  let volume6 = 0;
  let area2 = 0;
  let up2 = 0;
  let down2 = 0;
  let overhang2 = 0;
  let overhangCount = 0;
  let contact2 = 0;
  for (let t = 0; t < triangles; t++) {
    const a = idx[t * 3] * 3;
    const b = idx[t * 3 + 1] * 3;
    const c = idx[t * 3 + 2] * 3;
    const ax = p[a];
    const ay = p[a + 1];
    const az = p[a + 2];
    const ux = p[b] - ax;
    const uy = p[b + 1] - ay;
    const uz = p[b + 2] - az;
    const vx = p[c] - ax;
    const vy = p[c + 1] - ay;
    const vz = p[c + 2] - az;
    const nx = uy * vz - uz * vy;
    const ny = uz * vx - ux * vz;
    const nz = ux * vy - uy * vx;
    // a·(b×c) = a·((b-a)×(c-a)): shifting by a keeps the determinant and loses less precision
    volume6 += ax * nx + ay * ny + az * nz;
    const len2 = Math.sqrt(nx * nx + ny * ny + nz * nz);
    area2 += len2;
    if (nz > 0) {
      up2 += nz;
    } else if (nz < 0) {
      down2 -= nz;
      const onPlate = az <= plateZ && p[b + 2] <= plateZ && p[c + 2] <= plateZ;
      if (onPlate) {
        if (-nz >= contactCos * len2) contact2 += len2;
      } else if (-nz > sinLimit * len2) {
        overhangMask[t] = 1;
        overhangCount++;
        overhang2 += len2;
      }
    }
  }
  return {
    triangles,
    volumeMm3: volume6 / 6,
    surfaceAreaMm2: area2 / 2,
    upFacingAreaMm2: up2 / 2,
    downFacingAreaMm2: down2 / 2,
    minMm: triangles ? [minX, minY, minZ] : [0, 0, 0],
    maxMm: triangles ? [maxX, maxY, maxZ] : [0, 0, 0],
    overhangAreaMm2: overhang2 / 2,
    overhangFaceCount: overhangCount,
    overhangMask,
    bedContactAreaMm2: contact2 / 2,
  };
}
