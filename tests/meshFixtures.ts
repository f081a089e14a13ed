/** Test meshes built with JSCAD primitives and booleans, turned into the neutral indexed mesh. */
import jscad from '@jscad/modeling';
import type { Geom3 } from '@jscad/modeling/src/geometries/types';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { weldVertices } from '../shared/mesh/weldVertices';

const { geom3 } = jscad.geometries;

/**
 * Fan-triangulates a JSCAD solid into a welded indexed mesh.
 * @param geometry - a JSCAD geom3
 * @returns the mesh
 */
export function geomToMesh(geometry: Geom3): IndexedMesh {
  const soup: number[] = [];
  for (const polygon of geom3.toPolygons(geometry)) {
    const v = polygon.vertices;
    for (let i = 1; i + 1 < v.length; i++) soup.push(...v[0], ...v[i], ...v[i + 1]);
  }
  return weldVertices(Float32Array.from(soup));
}

/**
 * An axis-aligned box from min to max corner.
 * @param min - lower corner, mm
 * @param max - upper corner, mm
 */
export function box(min: [number, number, number], max: [number, number, number]): Geom3 {
  const size = [max[0] - min[0], max[1] - min[1], max[2] - min[2]] as [number, number, number];
  const center = [(max[0] + min[0]) / 2, (max[1] + min[1]) / 2, (max[2] + min[2]) / 2] as [number, number, number];
  return jscad.primitives.cuboid({ size, center });
}

/**
 * Writes a mesh as binary STL bytes (80-byte header, uint32 count, 50 bytes per facet).
 * @param mesh - the mesh
 */
export function toBinaryStl(mesh: IndexedMesh): Uint8Array {
  const n = mesh.indices.length / 3;
  const bytes = new Uint8Array(84 + 50 * n);
  const view = new DataView(bytes.buffer);
  view.setUint32(80, n, true);
  for (let t = 0; t < n; t++) {
    for (let k = 0; k < 3; k++) {
      const v = mesh.indices[t * 3 + k];
      for (let d = 0; d < 3; d++) view.setFloat32(84 + t * 50 + 12 + k * 12 + d * 4, mesh.positions[v * 3 + d], true);
    }
  }
  return bytes;
}

/**
 * Writes a mesh as ASCII STL text.
 * @param mesh - the mesh
 */
export function toAsciiStl(mesh: IndexedMesh): string {
  const lines = ['solid test'];
  for (let t = 0; t < mesh.indices.length / 3; t++) {
    lines.push('  facet normal 0 0 0', '    outer loop');
    for (let k = 0; k < 3; k++) {
      const v = mesh.indices[t * 3 + k];
      lines.push(`      vertex ${mesh.positions[v * 3]} ${mesh.positions[v * 3 + 1]} ${mesh.positions[v * 3 + 2]}`);
    }
    lines.push('    endloop', '  endfacet');
  }
  lines.push('endsolid test');
  return lines.join('\n');
}

type ManifoldModule = Awaited<ReturnType<typeof import('manifold-3d').default>>;
let manifoldModule: Promise<ManifoldModule> | null = null;

/** Loads manifold-3d once per test file (WASM). */
export function loadManifold(): Promise<ManifoldModule> {
  manifoldModule ??= import('manifold-3d').then(async ({ default: init }) => {
    const wasm = await init();
    wasm.setup();
    return wasm;
  });
  return manifoldModule;
}

/**
 * Copies a manifold-3d solid into the neutral indexed mesh.
 * @param solid - a Manifold
 */
export function manifoldToMesh(solid: {
  getMesh(): { numProp: number; vertProperties: Float32Array; triVerts: Uint32Array };
}): IndexedMesh {
  const mesh = solid.getMesh();
  const count = mesh.vertProperties.length / mesh.numProp;
  const positions = new Float32Array(count * 3);
  for (let i = 0; i < count; i++) {
    for (let d = 0; d < 3; d++) positions[i * 3 + d] = mesh.vertProperties[i * mesh.numProp + d];
  }
  return { positions, indices: Uint32Array.from(mesh.triVerts) };
}
