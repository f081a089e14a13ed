import { BufferAttribute, BufferGeometry } from 'three';
import type { IndexedMesh } from '../../../shared/schemas/mesh';

/** Surface colour of faces that print without support (linear RGB). */
export const SURFACE_RGB: readonly [number, number, number] = [0.78, 0.74, 0.66];
/** Warning colour for overhang faces that need support (linear RGB). */
export const OVERHANG_RGB: readonly [number, number, number] = [0.93, 0.36, 0.16];

/**
 * Builds a flat-shaded, non-indexed BufferGeometry from the neutral mesh, one colour per triangle so overhang
 * faces can be shaded in the warning colour. Flat shading keeps the facets of a printable mesh honest.
 * @param mesh - the neutral indexed mesh in millimetres
 * @param overhangMask - optional per-triangle flag (1 = overhang beyond the self-supporting angle)
 */
export function meshToBufferGeometry(mesh: IndexedMesh, overhangMask?: Uint8Array | null): BufferGeometry {
  const triangleCount = mesh.indices.length / 3;
  const positions = new Float32Array(triangleCount * 9);
  const normals = new Float32Array(triangleCount * 9);
  const colors = new Float32Array(triangleCount * 9);
  const useMask = overhangMask != null && overhangMask.length === triangleCount;
  for (let t = 0; t < triangleCount; t++) {
    const ia = mesh.indices[t * 3] * 3;
    const ib = mesh.indices[t * 3 + 1] * 3;
    const ic = mesh.indices[t * 3 + 2] * 3;
    const ax = mesh.positions[ia],
      ay = mesh.positions[ia + 1],
      az = mesh.positions[ia + 2];
    const bx = mesh.positions[ib],
      by = mesh.positions[ib + 1],
      bz = mesh.positions[ib + 2];
    const cx = mesh.positions[ic],
      cy = mesh.positions[ic + 1],
      cz = mesh.positions[ic + 2];
    const ux = bx - ax,
      uy = by - ay,
      uz = bz - az;
    const vx = cx - ax,
      vy = cy - ay,
      vz = cz - az;
    let nx = uy * vz - uz * vy,
      ny = uz * vx - ux * vz,
      nz = ux * vy - uy * vx;
    const length = Math.hypot(nx, ny, nz) || 1;
    nx /= length;
    ny /= length;
    nz /= length;
    const rgb = useMask && overhangMask[t] ? OVERHANG_RGB : SURFACE_RGB;
    const o = t * 9;
    positions[o] = ax;
    positions[o + 1] = ay;
    positions[o + 2] = az;
    positions[o + 3] = bx;
    positions[o + 4] = by;
    positions[o + 5] = bz;
    positions[o + 6] = cx;
    positions[o + 7] = cy;
    positions[o + 8] = cz;
    for (let k = 0; k < 3; k++) {
      normals[o + k * 3] = nx;
      normals[o + k * 3 + 1] = ny;
      normals[o + k * 3 + 2] = nz;
      colors[o + k * 3] = rgb[0];
      colors[o + k * 3 + 1] = rgb[1];
      colors[o + k * 3 + 2] = rgb[2];
    }
  }
  const geometry = new BufferGeometry();
  geometry.setAttribute('position', new BufferAttribute(positions, 3));
  geometry.setAttribute('normal', new BufferAttribute(normals, 3));
  geometry.setAttribute('color', new BufferAttribute(colors, 3));
  geometry.computeBoundingBox();
  geometry.computeBoundingSphere();
  return geometry;
}
