import jscad from '@jscad/modeling';
import type Geom3 from '@jscad/modeling/src/geometries/geom3/type';
import type { Solid } from './Solid';

/**
 * Copies a kernel solid into a JSCAD Geom3 (one triangle per polygon, outward winding), the plain-data form a
 * {@link TemplatePart} carries. The solid must be non-empty and valid.
 * @param solid - the finished part
 */
export function toGeom3(solid: Solid): Geom3 {
  const status = solid.manifold.status();
  if (status !== 'NoError') throw new Error(`Geometry kernel error: ${status}`);
  const mesh = solid.manifold.getMesh();
  const { vertProperties, triVerts, numProp } = mesh;
  const polygons = new Array(triVerts.length / 3);
  const point = (index: number): [number, number, number] => {
    const at = index * numProp;
    return [vertProperties[at], vertProperties[at + 1], vertProperties[at + 2]];
  };
  for (let tri = 0; tri < polygons.length; tri++) {
    // A JSCAD poly3 is a plain { vertices } object; building it directly skips a copy per triangle.
    polygons[tri] = { vertices: [point(triVerts[tri * 3]), point(triVerts[tri * 3 + 1]), point(triVerts[tri * 3 + 2])] };
  }
  return jscad.geometries.geom3.create(polygons);
}
