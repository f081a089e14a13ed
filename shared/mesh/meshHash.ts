import type { IndexedMesh } from '../schemas/mesh';

/** Positions are quantised to this many steps per millimetre before hashing (1 µm). */
export const MESH_HASH_STEPS_PER_MM = 1000;

/**
 * The canonical bytes a mesh hash is taken over: a little-endian header (vertex count, triangle count), the positions
 * quantised to whole micrometres as int32, then the triangle indices as uint32. The hash follows the shape to 1 µm
 * and the topology exactly, not the float formatting of any one runtime.
 * @param mesh - the mesh to serialise
 */
export function canonicalMeshBytes(mesh: IndexedMesh): Uint8Array<ArrayBuffer> {
  const vertexCount = mesh.positions.length / 3;
  const triangleCount = mesh.indices.length / 3;
  const bytes = new Uint8Array(8 + mesh.positions.length * 4 + mesh.indices.length * 4);
  const view = new DataView(bytes.buffer);
  view.setUint32(0, vertexCount, true);
  view.setUint32(4, triangleCount, true);
  let offset = 8;
  for (const value of mesh.positions) {
    view.setInt32(offset, Math.round(value * MESH_HASH_STEPS_PER_MM), true);
    offset += 4;
  }
  for (const index of mesh.indices) {
    view.setUint32(offset, index, true);
    offset += 4;
  }
  return bytes;
}

/**
 * sha256 (lower-case hex) of {@link canonicalMeshBytes}, via Web Crypto so the browser and the server agree.
 * @param mesh - the mesh to hash
 */
export async function meshHash(mesh: IndexedMesh): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', canonicalMeshBytes(mesh));
  return Array.from(new Uint8Array(digest), (byte) => byte.toString(16).padStart(2, '0')).join('');
}
