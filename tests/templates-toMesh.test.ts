/**
 * toMesh on geometry that did not come from the manifold kernel: a JSCAD union whose faces meet with T-junctions is
 * repaired into a closed 2-manifold mesh (checked by manifold-3d), and a mesh with a hole is rejected.
 */
import jscad from '@jscad/modeling';
import { describe, expect, it } from 'vitest';
import { MeshValidationError, assertClosedManifold, toMesh } from '../templates/lib/toMesh';
import { manifoldReport } from './templates.meshCheck';

const { cuboid } = jscad.primitives;
const { union } = jscad.booleans;

describe('toMesh', () => {
  it('repairs the T-junctions of a JSCAD union into a closed manifold mesh', async () => {
    // A small block on a big one: the big top face is split where the small block's edges meet it (T-junctions).
    const geometry = union(cuboid({ size: [40, 40, 10], center: [0, 0, 5] }), cuboid({ size: [10, 10, 10], center: [5, 3, 15] }));
    const mesh = toMesh([{ name: 'body', geometry }]);
    const report = await manifoldReport(mesh);
    // source: manifold-3d — NoError means closed and 2-manifold; volume analytic 40·40·10 + 10·10·10
    expect(report.status).toBe('NoError');
    expect(report.volumeMm3).toBeCloseTo(17_000, 3);
    expect(report.bodies).toBe(1);
  });

  it('rejects a mesh with a missing triangle', () => {
    const closed = toMesh([{ name: 'body', geometry: cuboid({ size: [10, 10, 10] }) }]);
    const open = { positions: closed.positions, indices: closed.indices.slice(3) };
    expect(() => assertClosedManifold(open)).toThrow(MeshValidationError);
  });
});
