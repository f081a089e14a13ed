import type { IndexedMesh } from '../schemas/mesh';
import type { BuildOrientation } from '../schemas/analysis';
import { DEFAULT_OVERHANG_DEG, measureMesh } from './measureMesh';
import { orientMesh } from './orientMesh';

/**
 * The per-face overhang flags exactly as the geometry analysis computes them (same orientation, same threshold), for
 * the preview to tint overhangs as soon as a mesh is built rather than after its figures.
 * @param mesh - the part in model coordinates, mm
 * @param up - the build orientation (the analysis's default, +z)
 * @param overhangDeg - threshold in degrees from vertical (the analysis's default, 45)
 * @returns 1 per overhang triangle, in the mesh's triangle order
 */
export function overhangMaskOf(
  mesh: IndexedMesh,
  up: BuildOrientation = '+z',
  overhangDeg = DEFAULT_OVERHANG_DEG,
): Uint8Array {
  return measureMesh(orientMesh(mesh, up), overhangDeg).overhangMask;
}
