import jscad from '@jscad/modeling';
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
 * Converts the parts of a template into one neutral {@link IndexedMesh}: polygons are fan-triangulated, exactly equal
 * vertices welded (per part, so touching parts stay separate bodies), and the result checked: every directed edge
 * must occur exactly once and its reverse exactly once (closed, 2-manifold, consistently wound).
 * @param parts - the template's parts, already in build orientation
 * @throws MeshValidationError when the mesh is not closed and manifold
 */
export function toMesh(parts: TemplatePart[]): IndexedMesh {
  const positions: number[] = [];
  const indices: number[] = [];
  for (const part of parts) {
    const weld = new Map<string, number>();
    const vertexIndex = (point: readonly number[]): number => {
      const key = `${point[0]},${point[1]},${point[2]}`;
      let index = weld.get(key);
      if (index === undefined) {
        index = positions.length / 3;
        positions.push(point[0], point[1], point[2]);
        weld.set(key, index);
      }
      return index;
    };
    for (const polygon of jscad.geometries.geom3.toPolygons(part.geometry)) {
      const ring = polygon.vertices.map(vertexIndex);
      for (let i = 1; i + 1 < ring.length; i++) {
        if (ring[0] === ring[i] || ring[i] === ring[i + 1] || ring[0] === ring[i + 1]) continue;
        indices.push(ring[0], ring[i], ring[i + 1]);
      }
    }
  }
  const mesh: IndexedMesh = { positions: new Float32Array(positions), indices: new Uint32Array(indices) };
  assertClosedManifold(mesh);
  return mesh;
}

/**
 * Throws unless every directed edge of the mesh occurs once and its reverse once.
 * @param mesh - the mesh to check
 */
export function assertClosedManifold(mesh: IndexedMesh): void {
  const { indices } = mesh;
  const vertexCount = mesh.positions.length / 3;
  const directed = new Map<number, number>();
  const key = (a: number, b: number): number => a * vertexCount + b;
  for (let t = 0; t < indices.length; t += 3) {
    for (let e = 0; e < 3; e++) {
      const k = key(indices[t + e], indices[t + ((e + 1) % 3)]);
      directed.set(k, (directed.get(k) ?? 0) + 1);
    }
  }
  let open = 0;
  let duplicated = 0;
  for (const [k, count] of directed) {
    if (count > 1) duplicated++;
    const a = Math.floor(k / vertexCount);
    const b = k - a * vertexCount;
    if (directed.get(key(b, a)) !== 1) open++;
  }
  if (open > 0 || duplicated > 0) {
    throw new MeshValidationError(
      `mesh is not closed and manifold: ${open} open or non-manifold edges, ${duplicated} edges used twice in one direction`,
    );
  }
}
