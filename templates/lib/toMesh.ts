import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { TemplatePart } from '../types';

/** A mesh that is not closed and 2-manifold with consistent winding; the message says where it fails. */
export class MeshValidationError extends Error {
  /** @param message - what is wrong with the mesh */
  constructor(message: string) {
    super(message);
    this.name = 'MeshValidationError';
  }
}

/**
 * Joins the parts of a template into one neutral {@link IndexedMesh} (each part's vertices kept apart, so touching
 * parts stay separate bodies) and checks it: every directed edge must occur exactly once and its reverse exactly
 * once (closed, 2-manifold, consistently wound).
 * @param parts - the template's parts, already in build orientation
 * @throws MeshValidationError when the mesh is not closed and manifold
 */
export function toMesh(parts: TemplatePart[]): IndexedMesh {
  return toMeshParts(parts).mesh;
}

/**
 * {@link toMesh}, also telling how many triangles each part has (the parts follow one another in the mesh).
 * @param parts - the template's parts, already in build orientation
 */
export function toMeshParts(parts: TemplatePart[]): { mesh: IndexedMesh; partTriangles: number[] } {
  const mesh = joinMeshes(parts.map((part) => part.mesh));
  assertClosedManifold(mesh);
  return { mesh, partTriangles: parts.map((part) => part.mesh.indices.length / 3) };
}

/** Concatenates indexed part meshes (index offsets added), in part order. */
function joinMeshes(meshes: IndexedMesh[]): IndexedMesh {
  if (meshes.length === 1) return { positions: meshes[0].positions, indices: meshes[0].indices };
  const positions = new Float32Array(meshes.reduce((n, m) => n + m.positions.length, 0));
  const indices = new Uint32Array(meshes.reduce((n, m) => n + m.indices.length, 0));
  let p = 0;
  let i = 0;
  for (const mesh of meshes) {
    const offset = p / 3;
    positions.set(mesh.positions, p);
    for (let k = 0; k < mesh.indices.length; k++) indices[i + k] = mesh.indices[k] + offset;
    p += mesh.positions.length;
    i += mesh.indices.length;
  }
  return { positions, indices };
}

/**
 * Throws unless every directed edge of the mesh occurs once and its reverse once. The directed edges are grouped by
 * their start vertex in flat typed arrays (a vertex has a handful of edges), so the check is linear in the mesh size.
 * A valid mesh (every build's) passes one quick pass; only a failing one is counted edge by edge for the message.
 * @param mesh - the mesh to check
 */
export function assertClosedManifold(mesh: IndexedMesh): void {
  const { indices } = mesh;
  const vertexCount = mesh.positions.length / 3;
  for (let k = 0; k < indices.length; k++) {
    if (indices[k] >= vertexCount)
      throw new MeshValidationError(`mesh is not valid: a triangle names vertex ${indices[k]} of ${vertexCount}`);
  }
  // Out-edges of each vertex: start[v] .. start[v + 1] in `ends`.
  const start = new Uint32Array(vertexCount + 1);
  for (let k = 0; k < indices.length; k++) start[indices[k] + 1]++;
  for (let v = 0; v < vertexCount; v++) start[v + 1] += start[v];
  const fill = start.slice(0, vertexCount);
  const ends = new Uint32Array(indices.length);
  for (let t = 0; t < indices.length; t += 3) {
    for (let e = 0; e < 3; e++) ends[fill[indices[t + e]]++] = indices[t + ((e + 1) % 3)];
  }
  if (!everyEdgeOnceEachWay(start, ends)) countFaults(start, ends);
}

/**
 * Whether every directed edge occurs once and its reverse once: no vertex lists an end twice, every upward edge
 * (a < b) has its reverse, and there are as many downward edges as upward ones. With no repeats the reverses of the
 * upward edges are distinct downward edges, so equal counts mean they are all of them.
 */
function everyEdgeOnceEachWay(start: Uint32Array, ends: Uint32Array): boolean {
  let upward = 0;
  for (let a = 0; a + 1 < start.length; a++) {
    const from = start[a];
    const to = start[a + 1];
    for (let k = from; k < to; k++) {
      const b = ends[k];
      for (let j = from; j < k; j++) if (ends[j] === b) return false;
      if (b <= a) continue;
      upward++;
      let reverse = false;
      for (let j = start[b]; j < start[b + 1] && !reverse; j++) reverse = ends[j] === a;
      if (!reverse) return false;
    }
  }
  return 2 * upward === ends.length;
}

/** Counts the open and the repeated directed edges and throws with them (only called on a mesh that fails). */
function countFaults(start: Uint32Array, ends: Uint32Array): never {
  const count = (from: number, to: number): number => {
    let n = 0;
    for (let k = start[from]; k < start[from + 1]; k++) if (ends[k] === to) n++;
    return n;
  };
  let open = 0;
  let duplicated = 0;
  for (let a = 0; a + 1 < start.length; a++) {
    for (let k = start[a]; k < start[a + 1]; k++) {
      const b = ends[k];
      // Count each distinct directed edge once: at its first occurrence in the list.
      let first = true;
      for (let j = start[a]; j < k; j++) if (ends[j] === b) first = false;
      if (!first) continue;
      if (count(a, b) > 1) duplicated++;
      if (count(b, a) !== 1) open++;
    }
  }
  throw new MeshValidationError(
    `mesh is not closed and manifold: ${open} open or non-manifold edges, ${duplicated} edges used twice in one direction`,
  );
}
