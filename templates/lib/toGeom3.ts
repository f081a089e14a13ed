import jscad from '@jscad/modeling';
import type Geom3 from '@jscad/modeling/src/geometries/geom3/type';
import type Poly3 from '@jscad/modeling/src/geometries/poly3/type';
import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { Solid } from './Solid';

/** The indexed mesh each kernel-made Geom3 was copied from, so toMesh can skip re-welding it. */
const sourceMeshes = new WeakMap<Geom3, IndexedMesh>();

/**
 * The indexed mesh a Geom3 made by {@link toGeom3} came from (vertices numbered in order of first use, as a weld
 * of its polygons would number them), or undefined for any other Geom3.
 * @param geometry - a part's geometry
 */
export function sourceMesh(geometry: Geom3): IndexedMesh | undefined {
  return sourceMeshes.get(geometry);
}

/**
 * Copies a kernel solid into a JSCAD Geom3 (one triangle per polygon, outward winding), the plain-data form a
 * {@link TemplatePart} carries. The polygons are made on first read: generate() goes straight from the kernel's
 * indexed mesh to the neutral mesh, and only callers that want JSCAD polygons pay for them.
 * @param solid - the finished part (non-empty and valid)
 */
export function toGeom3(solid: Solid): Geom3 {
  const status = solid.manifold.status();
  if (status !== 'NoError') throw new Error(`Geometry kernel error: ${status}`);
  const { vertProperties, triVerts, numProp } = solid.manifold.getMesh();
  // Renumber vertices by first use in the triangle list: the same numbering a weld of the polygons gives.
  const renumber = new Int32Array(vertProperties.length / numProp).fill(-1);
  const indices = new Uint32Array(triVerts.length);
  const positions: number[] = [];
  for (let i = 0; i < triVerts.length; i++) {
    const v = triVerts[i];
    if (renumber[v] < 0) {
      renumber[v] = positions.length / 3;
      positions.push(vertProperties[v * numProp], vertProperties[v * numProp + 1], vertProperties[v * numProp + 2]);
    }
    indices[i] = renumber[v];
  }
  const mesh: IndexedMesh = { positions: new Float32Array(positions), indices };
  const geometry = jscad.geometries.geom3.create();
  let polygons: Poly3[] | undefined;
  Object.defineProperty(geometry, 'polygons', {
    enumerable: true,
    configurable: true,
    get: () => (polygons ??= polygonsOf(mesh)),
    set: (value: Poly3[]) => {
      polygons = value;
    },
  });
  sourceMeshes.set(geometry, mesh);
  return geometry;
}

function polygonsOf(mesh: IndexedMesh): Poly3[] {
  const p = mesh.positions;
  const point = (v: number): [number, number, number] => [p[v * 3], p[v * 3 + 1], p[v * 3 + 2]];
  const polygons: Poly3[] = new Array(mesh.indices.length / 3);
  for (let t = 0; t < polygons.length; t++) {
    // A JSCAD poly3 is a plain { vertices } object; building it directly skips a copy per triangle.
    polygons[t] = {
      vertices: [point(mesh.indices[t * 3]), point(mesh.indices[t * 3 + 1]), point(mesh.indices[t * 3 + 2])],
    };
  }
  return polygons;
}
