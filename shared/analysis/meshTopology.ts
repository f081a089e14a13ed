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
 * Counts open, non-manifold and misoriented edges by bucketing each edge under its lower vertex (a counting sort, no
 * hashing), finds the face across each edge, and counts connected parts with a union-find over vertices.
 * @param mesh - a welded indexed mesh
 * @returns the topology
 */
export function meshTopology(mesh: IndexedMesh): MeshTopology {
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const vertexCount = (mesh.positions.length / 3) | 0;
  const uses = triangles * 3;
  // Bucket every edge use under its lower vertex (counting sort), then match uses inside each small bucket.
  const start = new Uint32Array(vertexCount + 1);
  for (let u = 0; u < uses; u++) {
    const a = idx[u];
    const b = idx[u - (u % 3) + (((u % 3) + 1) % 3)];
    start[(a < b ? a : b) + 1]++;
  }
  for (let v = 0; v < vertexCount; v++) start[v + 1] += start[v];
  const fill = start.slice(0, vertexCount);
  const useOf = new Uint32Array(uses);
  for (let u = 0; u < uses; u++) {
    const a = idx[u];
    const b = idx[u - (u % 3) + (((u % 3) + 1) % 3)];
    useOf[fill[a < b ? a : b]++] = u;
  }
  const neighbours = new Int32Array(uses).fill(-1);
  const done = new Uint8Array(uses);
  let openEdges = 0;
  let nonManifoldEdges = 0;
  let misorientedEdges = 0;
  const hiOf = (u: number): number => {
    const a = idx[u];
    const b = idx[u - (u % 3) + (((u % 3) + 1) % 3)];
    return a < b ? b : a;
  };
  const forwardOf = (u: number): boolean => idx[u] < idx[u - (u % 3) + (((u % 3) + 1) % 3)];
  for (let v = 0; v < vertexCount; v++) {
    const end = start[v + 1];
    for (let i = start[v]; i < end; i++) {
      if (done[i]) continue;
      const first = useOf[i];
      const hi = hiOf(first);
      let count = 1;
      let forward = forwardOf(first) ? 1 : 0;
      let second = -1;
      for (let j = i + 1; j < end; j++) {
        if (done[j] || hiOf(useOf[j]) !== hi) continue;
        done[j] = 1;
        count++;
        if (forwardOf(useOf[j])) forward++;
        if (second < 0) second = useOf[j];
      }
      if (count === 1) openEdges++;
      else if (count > 2) nonManifoldEdges++;
      else {
        if (forward !== 1) misorientedEdges++;
        neighbours[first] = (second / 3) | 0;
        neighbours[second] = (first / 3) | 0;
      }
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

/**
 * Connected parts of a mesh (triangles joined by shared vertices): for every vertex the id of its part, -1 for a
 * vertex no triangle uses. Ids run from 0 in order of first appearance.
 * @param mesh - the mesh
 * @returns per-vertex part id and the number of parts
 */
export function componentOfVertex(mesh: IndexedMesh): { part: Int32Array; count: number } {
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
  const part = new Int32Array(vertexCount).fill(-1);
  const idOfRoot = new Int32Array(vertexCount).fill(-1);
  let count = 0;
  for (let i = 0; i < vertexCount; i++) {
    if (!used[i]) continue;
    const root = find(i);
    if (idOfRoot[root] < 0) idOfRoot[root] = count++;
    part[i] = idOfRoot[root];
  }
  return { part, count };
}

function countComponents(mesh: IndexedMesh): number {
  return componentOfVertex(mesh).count;
}
