/**
 * The neutral mesh straight from the kernel: every part's mesh equals a weld of its own triangle soup (so the
 * numbering depends only on the triangles), touching parts stay separate bodies, and a mesh with a hole is rejected.
 * Checked with manifold-3d and a vertex weld written independently of partMesh (shared/mesh/weldVertices).
 */
import { describe, expect, it } from 'vitest';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { meshHash } from '../shared/mesh/meshHash';
import { weldVertices } from '../shared/mesh/weldVertices';
import { TEMPLATES, parseParams } from '../templates/index';
import { loadKernel } from '../templates/lib/kernel';
import { partMesh } from '../templates/lib/partMesh';
import { scoped } from '../templates/lib/scope';
import { Solid } from '../templates/lib/Solid';
import { MeshValidationError, assertClosedManifold, toMesh, toMeshParts } from '../templates/lib/toMesh';
import { manifoldReport } from './templates.meshCheck';

/** The triangle soup of a mesh (9 floats per triangle). */
function soup(mesh: IndexedMesh): Float32Array {
  const out = new Float32Array(mesh.indices.length * 3);
  for (let i = 0; i < mesh.indices.length; i++)
    out.set(mesh.positions.subarray(mesh.indices[i] * 3, mesh.indices[i] * 3 + 3), i * 3);
  return out;
}

describe('toMesh', () => {
  it('keeps touching parts apart as separate closed bodies', async () => {
    await loadKernel();
    const parts = scoped(() => [
      { name: 'a', mesh: partMesh(Solid.box([10, 10, 10])) },
      { name: 'b', mesh: partMesh(Solid.box([10, 10, 10], [10, 0, 0])) },
    ]);
    const { mesh, partTriangles } = toMeshParts(parts);
    const report = await manifoldReport(mesh);
    // source: manifold-3d — NoError means closed and 2-manifold; two 10 mm cubes, 12 triangles each
    expect(report.status).toBe('NoError');
    expect(report.bodies).toBe(2);
    expect(report.volumeMm3).toBeCloseTo(2000, 3);
    expect(partTriangles).toEqual([12, 12]);
  });

  it('rejects a mesh with a missing triangle and one with a doubled triangle', async () => {
    await loadKernel();
    const closed = scoped(() => toMesh([{ name: 'body', mesh: partMesh(Solid.box([10, 10, 10])) }]));
    expect(() => assertClosedManifold(closed)).not.toThrow();
    const open = { positions: closed.positions, indices: closed.indices.slice(3) };
    expect(() => assertClosedManifold(open)).toThrow(MeshValidationError);
    const doubled = {
      positions: closed.positions,
      indices: new Uint32Array([...closed.indices, ...closed.indices.slice(0, 3)]),
    };
    expect(() => assertClosedManifold(doubled)).toThrow(MeshValidationError);
  });

  it.each(TEMPLATES.map((t) => [t.id, t] as const))(
    '%s: each part mesh is the weld of its own triangles (numbering by first use)',
    async (_id, template) => {
      await loadKernel();
      const output = scoped(() => template.build(parseParams(template, {})));
      for (const part of output.parts) {
        expect(await meshHash(weldVertices(soup(part.mesh)))).toBe(await meshHash(part.mesh));
      }
    },
    60_000,
  );
});
