import type { IndexedMesh } from '../schemas/mesh';
import { heightInTriangle } from './heightInTriangle';
import { PlateGrid } from './PlateGrid';

/** Options of the support estimate. */
export interface SupportVolumeOptions {
  /** Most rays to cast; the grid pitch grows to stay under it. */
  maxRays?: number;
  /** Finest grid pitch, mm. */
  minPitchMm?: number;
}

/** Support estimate and what it cost. */
export interface SupportVolumeResult {
  supportVolumeMm3: number;
  pitchMm: number;
  rays: number;
}

// Grid offsets as fractions of the pitch, chosen so sample points do not fall on the edges of parts drawn on round
// millimetres (a point on a shared edge would be counted by both faces).
const OFFSET_X = 0.5123;
const OFFSET_Y = 0.4871;

/**
 * Volume of support under the overhang faces: from sample points on an x-y grid inside each overhang face, rays go
 * straight down to the first up-facing surface of the part or to the plate; each ray stands for pitch² of area.
 * The pitch adapts to the overhangs' projected area so at most `maxRays` rays are cast.
 * @param mesh - the part in build orientation
 * @param overhangMask - 1 for each face that needs support (from measureMesh)
 * @param minMm - lower corner of the bounds (minMm[2] is the plate)
 * @param maxMm - upper corner of the bounds
 * @param options - ray budget and finest pitch
 * @returns volume in mm³, the pitch used and the number of rays
 */
export function supportVolume(
  mesh: IndexedMesh,
  overhangMask: Uint8Array,
  minMm: readonly number[],
  maxMm: readonly number[],
  options: SupportVolumeOptions = {},
): SupportVolumeResult {
  const maxRays = options.maxRays ?? 200_000;
  const minPitchMm = options.minPitchMm ?? 0.1;
  const p = mesh.positions;
  const idx = mesh.indices;
  let projected = 0;
  for (let t = 0; t < overhangMask.length; t++) {
    if (!overhangMask[t]) continue;
    const a = idx[t * 3] * 3;
    const b = idx[t * 3 + 1] * 3;
    const c = idx[t * 3 + 2] * 3;
    projected -= ((p[b] - p[a]) * (p[c + 1] - p[a + 1]) - (p[b + 1] - p[a + 1]) * (p[c] - p[a])) / 2;
  }
  if (projected <= 0) return { supportVolumeMm3: 0, pitchMm: minPitchMm, rays: 0 };
  const pitch = Math.max(minPitchMm, Math.sqrt(projected / maxRays));
  const grid = new PlateGrid(mesh, minMm, maxMm);
  const x0 = minMm[0] + OFFSET_X * pitch;
  const y0 = minMm[1] + OFFSET_Y * pitch;
  const plate = minMm[2];
  let columnSum = 0;
  let rays = 0;
  for (let t = 0; t < overhangMask.length; t++) {
    if (!overhangMask[t]) continue;
    const a = idx[t * 3] * 3;
    const b = idx[t * 3 + 1] * 3;
    const c = idx[t * 3 + 2] * 3;
    const ax = p[a];
    const ay = p[a + 1];
    const bx = p[b];
    const by = p[b + 1];
    const cx = p[c];
    const cy = p[c + 1];
    const area = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax); // negative: the face points down
    if (area === 0) continue;
    const i0 = Math.ceil((Math.min(ax, bx, cx) - x0) / pitch);
    const i1 = Math.floor((Math.max(ax, bx, cx) - x0) / pitch);
    const j0 = Math.ceil((Math.min(ay, by, cy) - y0) / pitch);
    const j1 = Math.floor((Math.max(ay, by, cy) - y0) / pitch);
    for (let j = j0; j <= j1; j++) {
      const y = y0 + j * pitch;
      for (let i = i0; i <= i1; i++) {
        const x = x0 + i * pitch;
        const z = heightInTriangle(p, a, b, c, area, x, y);
        if (Number.isNaN(z)) continue; // outside the face
        rays++;
        columnSum += z - grid.castDown(x, y, z, plate);
      }
    }
  }
  return { supportVolumeMm3: columnSum * pitch * pitch, pitchMm: pitch, rays };
}
