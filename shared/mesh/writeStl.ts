import type { IndexedMesh } from '../schemas/mesh';

/** Header text of every binary STL we write; it must not start with "solid" or readers take the file for ASCII. */
export const STL_HEADER = 'Nestwright binary STL, units: millimetre';

/**
 * Writes a binary STL: 80-byte header, uint32 triangle count, then per triangle the unit normal, three vertices
 * (float32, little-endian) and a zero uint16 attribute count, so the file is 84 + 50·N bytes
 * (source: Paul Bourke, "STL format", 1999).
 * @param mesh - a validated, outward-wound mesh in millimetres
 */
export function writeStl(mesh: IndexedMesh): Uint8Array<ArrayBuffer> {
  const { positions: p, indices } = mesh;
  const triangles = indices.length / 3;
  const bytes = new Uint8Array(84 + 50 * triangles);
  const view = new DataView(bytes.buffer);
  const header = new TextEncoder().encode(STL_HEADER);
  bytes.set(header.subarray(0, 80));
  view.setUint32(80, triangles, true);
  let offset = 84;
  for (let t = 0; t < triangles; t++) {
    const a = indices[t * 3] * 3;
    const b = indices[t * 3 + 1] * 3;
    const c = indices[t * 3 + 2] * 3;
    const ux = p[b] - p[a];
    const uy = p[b + 1] - p[a + 1];
    const uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a];
    const vy = p[c + 1] - p[a + 1];
    const vz = p[c + 2] - p[a + 2];
    let nx = uy * vz - uz * vy;
    let ny = uz * vx - ux * vz;
    let nz = ux * vy - uy * vx;
    const length = Math.hypot(nx, ny, nz) || 1;
    nx /= length;
    ny /= length;
    nz /= length;
    for (const value of [nx, ny, nz, p[a], p[a + 1], p[a + 2], p[b], p[b + 1], p[b + 2], p[c], p[c + 1], p[c + 2]]) {
      view.setFloat32(offset, value, true);
      offset += 4;
    }
    view.setUint16(offset, 0, true);
    offset += 2;
  }
  return bytes;
}
