import jscad from '@jscad/modeling';
import type { IndexedMesh } from '../../shared/schemas/mesh';
import type Geom3 from '@jscad/modeling/src/geometries/geom3/type';
import type { TemplatePart } from '../types';
import { sourceMesh } from './toGeom3';

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
 * must occur exactly once and its reverse exactly once (closed, 2-manifold, consistently wound). Parts built by the
 * manifold kernel pass at once; geometry from JSCAD booleans, which can leave T-junctions, is first repaired with
 * JSCAD's `generalize({ snap, triangulate })` (it inserts the missing vertices) and checked again.
 * @param parts - the template's parts, already in build orientation
 * @throws MeshValidationError when the mesh is not closed and manifold even after repair
 */
export function toMesh(parts: TemplatePart[]): IndexedMesh {
  return toMeshParts(parts).mesh;
}

/**
 * {@link toMesh}, also telling how many triangles each part has (the parts follow one another in the mesh).
 * @param parts - the template's parts, already in build orientation
 */
export function toMeshParts(parts: TemplatePart[]): { mesh: IndexedMesh; partTriangles: number[] } {
  const meshes = parts.map((part) => sourceMesh(part.geometry));
  if (meshes.every((mesh) => mesh !== undefined)) {
    const joined = joinMeshes(meshes as IndexedMesh[]);
    assertClosedManifold(joined);
    return { mesh: joined, partTriangles: (meshes as IndexedMesh[]).map((mesh) => mesh.indices.length / 3) };
  }
  const welded = weldParts(parts.map((part) => part.geometry));
  try {
    assertClosedManifold(welded.mesh);
    return welded;
  } catch (err) {
    if (!(err instanceof MeshValidationError)) throw err;
  }
  const repaired = weldParts(parts.map((part) => generalize({ snap: true, triangulate: true }, part.geometry)));
  assertClosedManifold(repaired.mesh);
  return repaired;
}

// The package's typings declare this module export as a default that is not there; the runtime export is the function.
const generalize = jscad.modifiers.generalize as unknown as (
  options: { snap: boolean; triangulate: boolean },
  geometry: Geom3,
) => Geom3;

/** Concatenates already indexed part meshes (index offsets added), in part order. */
function joinMeshes(meshes: IndexedMesh[]): IndexedMesh {
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

function weldParts(geometries: Geom3[]): { mesh: IndexedMesh; partTriangles: number[] } {
  const positions: number[] = [];
  const indices: number[] = [];
  const partTriangles: number[] = [];
  for (const geometry of geometries) {
    const weld = new VertexWeld(positions);
    const before = indices.length;
    for (const polygon of jscad.geometries.geom3.toPolygons(geometry)) {
      const ring = polygon.vertices.map((point) => weld.index(point[0], point[1], point[2]));
      for (let i = 1; i + 1 < ring.length; i++) {
        if (ring[0] === ring[i] || ring[i] === ring[i + 1] || ring[0] === ring[i + 1]) continue;
        indices.push(ring[0], ring[i], ring[i + 1]);
      }
    }
    partTriangles.push((indices.length - before) / 3);
  }
  return { mesh: { positions: new Float32Array(positions), indices: new Uint32Array(indices) }, partTriangles };
}

/**
 * Welds exactly equal float32 positions with an open-addressing hash table on their bit patterns (string keys are
 * several times slower on meshes of tens of thousands of vertices).
 */
class VertexWeld {
  private table = new Int32Array(1 << 12).fill(-1);
  private count = 0;
  private readonly bits = new Uint32Array(3);
  private readonly floats = new Float32Array(this.bits.buffer);
  private readonly first: number;

  constructor(private readonly positions: number[]) {
    this.first = positions.length / 3;
  }

  index(x: number, y: number, z: number): number {
    if (this.count * 2 >= this.table.length) this.grow();
    this.floats[0] = x;
    this.floats[1] = y;
    this.floats[2] = z;
    const mask = this.table.length - 1;
    let slot = this.hash() & mask;
    for (;;) {
      const found = this.table[slot];
      if (found < 0) break;
      const at = found * 3;
      if (
        this.positions[at] === this.floats[0] &&
        this.positions[at + 1] === this.floats[1] &&
        this.positions[at + 2] === this.floats[2]
      ) {
        return found;
      }
      slot = (slot + 1) & mask;
    }
    const index = this.positions.length / 3;
    this.positions.push(this.floats[0], this.floats[1], this.floats[2]);
    this.table[slot] = index;
    this.count++;
    return index;
  }

  private hash(): number {
    let h = Math.imul(this.bits[0] ^ 0x9e3779b9, 0x85ebca6b);
    h = Math.imul(h ^ this.bits[1] ^ (h >>> 13), 0xc2b2ae35);
    h = Math.imul(h ^ this.bits[2] ^ (h >>> 16), 0x27d4eb2f);
    return (h ^ (h >>> 15)) >>> 0;
  }

  private grow(): void {
    const old = this.table;
    this.table = new Int32Array(old.length * 2).fill(-1);
    const mask = this.table.length - 1;
    for (let v = this.first; v < this.positions.length / 3; v++) {
      this.floats[0] = this.positions[v * 3];
      this.floats[1] = this.positions[v * 3 + 1];
      this.floats[2] = this.positions[v * 3 + 2];
      let slot = this.hash() & mask;
      while (this.table[slot] >= 0) slot = (slot + 1) & mask;
      this.table[slot] = v;
    }
  }
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
