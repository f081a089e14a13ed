import type { IndexedMesh } from '../schemas/mesh';

/** Edge and connectivity facts of a mesh. */
export interface MeshTopology {
  /** Edges used by one triangle only. */
  openEdges: number;
  /** Edges used by more than two triangles. */
  nonManifoldEdges: number;
  /** Edges used by two triangles in the same direction (one of them is wound inside out). */
  misorientedEdges: number;
  /** Every edge shared by exactly two triangles in opposite directions. */
  watertight: boolean;
  /** Connected parts, joined through shared vertices. */
  components: number;
  /**
   * For face t and its edge k (corner k to corner k+1), the face across that edge, or -1 when the edge is open or
   * non-manifold.
   */
  neighbours: Int32Array;
}

/**
 * Counts open, non-manifold and misoriented edges with a hash table keyed on vertex pairs, finds the face across
 * each edge, and counts connected parts with a union-find over vertices.
 * @param mesh - a welded indexed mesh
 * @returns the topology
 */
export function meshTopology(mesh: IndexedMesh): MeshTopology {
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const edgeSlots = triangles * 3;
  let size = 1024;
  while (size < edgeSlots * 2) size *= 2;
  const mask = size - 1;
  const keyLo = new Uint32Array(size).fill(0xffffffff);
  const keyHi = new Uint32Array(size);
  const forward = new Uint16Array(size); // uses lo -> hi
  const backward = new Uint16Array(size); // uses hi -> lo
  const firstUse = new Int32Array(size); // face * 3 + k of the first use
  const neighbours = new Int32Array(edgeSlots).fill(-1);
  for (let t = 0; t < triangles; t++) {
    for (let k = 0; k < 3; k++) {
      const a = idx[t * 3 + k];
      const b = idx[t * 3 + ((k + 1) % 3)];
      const lo = a < b ? a : b;
      const hi = a < b ? b : a;
      let slot = (Math.imul(lo, 0x9e3779b1) ^ Math.imul(hi, 0x85ebca77)) & mask;
      while (keyLo[slot] !== 0xffffffff && (keyLo[slot] !== lo || keyHi[slot] !== hi)) slot = (slot + 1) & mask;
      if (keyLo[slot] === 0xffffffff) {
        keyLo[slot] = lo;
        keyHi[slot] = hi;
        firstUse[slot] = t * 3 + k;
      } else if (forward[slot] + backward[slot] === 1) {
        const other = firstUse[slot];
        neighbours[other] = t;
        neighbours[t * 3 + k] = (other / 3) | 0;
      } else {
        neighbours[firstUse[slot]] = -1; // a third use: nothing across this edge is reliable
      }
      if (a === lo) forward[slot] = Math.min(forward[slot] + 1, 0xffff);
      else backward[slot] = Math.min(backward[slot] + 1, 0xffff);
    }
  }
  let openEdges = 0;
  let nonManifoldEdges = 0;
  let misorientedEdges = 0;
  for (let s = 0; s < size; s++) {
    if (keyLo[s] === 0xffffffff) continue;
    const uses = forward[s] + backward[s];
    if (uses === 1) openEdges++;
    else if (uses > 2) nonManifoldEdges++;
    else if (forward[s] !== 1) misorientedEdges++;
  }
  // Faces beside a non-manifold edge keep no neighbour there (the table above cleared the first; clear the rest).
  for (let t = 0; t < triangles; t++) {
    for (let k = 0; k < 3; k++) {
      const n = neighbours[t * 3 + k];
      if (n < 0) continue;
      const a = idx[t * 3 + k];
      const b = idx[t * 3 + ((k + 1) % 3)];
      let back = false;
      for (let j = 0; j < 3; j++) {
        const c = idx[n * 3 + j];
        const d = idx[n * 3 + ((j + 1) % 3)];
        if ((c === a && d === b) || (c === b && d === a)) back = neighbours[n * 3 + j] === t;
      }
      if (!back) neighbours[t * 3 + k] = -1;
    }
  }
  return {
    openEdges,
    nonManifoldEdges,
    misorientedEdges,
    watertight: triangles > 0 && openEdges === 0 && nonManifoldEdges === 0 && misorientedEdges === 0,
    components: countComponents(mesh),
    neighbours,
  };
}

function countComponents(mesh: IndexedMesh): number {
  const vertexCount = (mesh.positions.length / 3) | 0;
  const parent = new Int32Array(vertexCount);
  for (let i = 0; i < vertexCount; i++) parent[i] = i;
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  const used = new Uint8Array(vertexCount);
  const idx = mesh.indices;
  for (let i = 0; i + 2 < idx.length; i += 3) {
    const a = find(idx[i]);
    const b = find(idx[i + 1]);
    const c = find(idx[i + 2]);
    used[idx[i]] = used[idx[i + 1]] = used[idx[i + 2]] = 1;
    if (a !== b) parent[b] = a;
    const c2 = find(c);
    const a2 = find(a);
    if (c2 !== a2) parent[c2] = a2;
  }
  let components = 0;
  for (let i = 0; i < vertexCount; i++) if (used[i] && find(i) === i) components++;
  return components;
}
