import type { IndexedMesh } from '../schemas/mesh';

/**
 * Turns a triangle soup (9 floats per triangle) into an indexed mesh, merging vertices whose float32 coordinates
 * are bit-identical (after folding -0 into 0). Triangles that collapse (two equal corners) are dropped.
 * @param soup - x,y,z of the three corners of each triangle, in mm
 * @returns the welded mesh
 */
export function weldVertices(soup: Float32Array): IndexedMesh {
  const cornerCount = Math.floor(soup.length / 3);
  let tableSize = 1024;
  while (tableSize < cornerCount * 2) tableSize *= 2;
  const mask = tableSize - 1;
  const table = new Int32Array(tableSize).fill(-1);
  const positions = new Float32Array(cornerCount * 3);
  const bits = new Uint32Array(positions.buffer);
  const remap = new Uint32Array(cornerCount);
  const probe = new Float32Array(3);
  const probeBits = new Uint32Array(probe.buffer);
  let vertexCount = 0;
  for (let c = 0; c < cornerCount; c++) {
    probe[0] = soup[c * 3] + 0;
    probe[1] = soup[c * 3 + 1] + 0;
    probe[2] = soup[c * 3 + 2] + 0;
    const bx = probeBits[0];
    const by = probeBits[1];
    const bz = probeBits[2];
    let slot = (Math.imul(bx, 73856093) ^ Math.imul(by, 19349663) ^ Math.imul(bz, 83492791)) & mask;
    for (;;) {
      const v = table[slot];
      if (v < 0) {
        table[slot] = vertexCount;
        positions[vertexCount * 3] = probe[0];
        positions[vertexCount * 3 + 1] = probe[1];
        positions[vertexCount * 3 + 2] = probe[2];
        remap[c] = vertexCount++;
        break;
      }
      if (bits[v * 3] === bx && bits[v * 3 + 1] === by && bits[v * 3 + 2] === bz) {
        remap[c] = v;
        break;
      }
      slot = (slot + 1) & mask;
    }
  }
  const indices = new Uint32Array(cornerCount - (cornerCount % 3));
  let kept = 0;
  for (let t = 0; t + 2 < cornerCount; t += 3) {
    const a = remap[t];
    const b = remap[t + 1];
    const c = remap[t + 2];
    if (a === b || b === c || a === c) continue;
    indices[kept++] = a;
    indices[kept++] = b;
    indices[kept++] = c;
  }
  return { positions: positions.slice(0, vertexCount * 3), indices: indices.slice(0, kept) };
}
