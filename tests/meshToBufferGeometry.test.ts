/**
 * The viewer's seam: the neutral indexed mesh becomes a flat-shaded BufferGeometry with one colour per triangle, so
 * overhang faces can be shaded. Checked on a unit cube (analytic: 12 triangles, outward normals, area 6).
 */
import { describe, expect, it } from 'vitest';
import { meshToBufferGeometry, OVERHANG_RGB, SURFACE_RGB } from '../src/components/viewer/meshToBufferGeometry';
import { fromDisplayLength, toDisplayLength } from '../src/components/editor/lengthUnits';
import type { IndexedMesh } from '../shared/schemas/mesh';

/** A 10 mm cube, counter-clockwise seen from outside. */
function cube(): IndexedMesh {
  const s = 10;
  const positions = new Float32Array([0, 0, 0, s, 0, 0, s, s, 0, 0, s, 0, 0, 0, s, s, 0, s, s, s, s, 0, s, s]);
  const indices = new Uint32Array([
    0,
    2,
    1,
    0,
    3,
    2, // bottom (-z)
    4,
    5,
    6,
    4,
    6,
    7, // top (+z)
    0,
    1,
    5,
    0,
    5,
    4, // front (-y)
    1,
    2,
    6,
    1,
    6,
    5, // right (+x)
    2,
    3,
    7,
    2,
    7,
    6, // back (+y)
    3,
    0,
    4,
    3,
    4,
    7, // left (-x)
  ]);
  return { positions, indices };
}

describe('meshToBufferGeometry', () => {
  it('unrolls every triangle with its outward face normal', () => {
    const geometry = meshToBufferGeometry(cube());
    const position = geometry.getAttribute('position');
    const normal = geometry.getAttribute('normal');
    expect(position.count).toBe(36);
    // First two triangles are the bottom face: normal (0, 0, -1) on all six vertices.
    for (let v = 0; v < 6; v++) expect([normal.getX(v), normal.getY(v), normal.getZ(v)]).toEqual([0, 0, -1]);
    for (let v = 6; v < 12; v++) expect(normal.getZ(v)).toBeCloseTo(1, 12);
    // Bounding box equals the cube (analytic).
    expect(geometry.boundingBox!.max.toArray()).toEqual([10, 10, 10]);
    geometry.dispose();
  });

  it('colours the masked triangles in the warning colour and the rest in the surface colour', () => {
    const mask = new Uint8Array(12);
    mask[0] = 1;
    mask[1] = 1; // the bottom face, facing straight down: an overhang if it were not on the plate
    const geometry = meshToBufferGeometry(cube(), mask);
    const color = geometry.getAttribute('color');
    for (let v = 0; v < 6; v++) expect(color.getX(v)).toBeCloseTo(OVERHANG_RGB[0], 6);
    for (let v = 6; v < 36; v++) expect(color.getX(v)).toBeCloseTo(SURFACE_RGB[0], 6);
    geometry.dispose();
  });

  it('ignores a mask whose length does not match the triangle count', () => {
    const geometry = meshToBufferGeometry(cube(), new Uint8Array(3).fill(1));
    const color = geometry.getAttribute('color');
    for (let v = 0; v < 36; v++) expect(color.getX(v)).toBeCloseTo(SURFACE_RGB[0], 6);
    geometry.dispose();
  });
});

describe('length display', () => {
  it('converts with 25.4 mm per inch and stores millimetres to 0.01 mm', () => {
    // source: 1 in = 25.4 mm exactly (international inch, 1959)
    expect(toDisplayLength(25.4, 'in')).toBeCloseTo(1, 12);
    expect(toDisplayLength(32, 'mm')).toBe(32);
    expect(fromDisplayLength(1.25, 'in')).toBeCloseTo(31.75, 9);
    expect(fromDisplayLength(1.26, 'in')).toBeCloseTo(32.0, 9); // 32.004 rounds to 32.00
  });
});
