/**
 * toMesh on geometry that did not come from the manifold kernel: a JSCAD union whose faces meet with T-junctions is
 * repaired into a closed 2-manifold mesh (checked by manifold-3d), and a mesh with a hole is rejected.
 */
import jscad from '@jscad/modeling';
import { describe, expect, it } from 'vitest';
import { meshHash } from '../shared/mesh/meshHash';
import { TEMPLATES, parseParams } from '../templates/index';
import { loadKernel } from '../templates/lib/kernel';
import { scoped } from '../templates/lib/scope';
import { MeshValidationError, assertClosedManifold, toMesh } from '../templates/lib/toMesh';
import { manifoldReport } from './templates.meshCheck';

const { cuboid } = jscad.primitives;
const { union } = jscad.booleans;

describe('toMesh', () => {
  it('repairs the T-junctions of a JSCAD union into a closed manifold mesh', async () => {
    // A small block on a big one: the big top face is split where the small block's edges meet it (T-junctions).
    const geometry = union(
      cuboid({ size: [40, 40, 10], center: [0, 0, 5] }),
      cuboid({ size: [10, 10, 10], center: [5, 3, 15] }),
    );
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

  it.each(TEMPLATES.map((t) => [t.id, t] as const))(
    '%s: the kernel-mesh shortcut and a weld of plain polygon copies give the same mesh hash',
    async (_id, template) => {
      await loadKernel();
      const output = scoped(() => template.build(parseParams(template, {})));
      const copies = output.parts.map((part) => ({
        name: part.name,
        geometry: jscad.geometries.geom3.create(
          jscad.geometries.geom3.toPolygons(part.geometry).map((polygon) => ({
            vertices: polygon.vertices.map((v) => [v[0], v[1], v[2]] as [number, number, number]),
          })),
        ),
      }));
      expect(await meshHash(toMesh(copies))).toBe(await meshHash(toMesh(output.parts)));
    },
    60_000,
  );
});
