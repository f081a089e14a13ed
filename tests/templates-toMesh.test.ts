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

  it('names the faults it finds: a missing triangle, a doubled one, one wound the wrong way', async () => {
    await loadKernel();
    const closed = scoped(() => toMesh([{ name: 'body', mesh: partMesh(Solid.box([10, 10, 10])) }]));
    // Common practice (edge counting on a closed, consistently wound triangle mesh): removing one triangle leaves
    // its 3 edges without their reverse.
    const open = { positions: closed.positions, indices: closed.indices.slice(3) };
    expect(() => assertClosedManifold(open)).toThrow('3 open or non-manifold edges, 0 edges used twice');
    // A triangle added twice: its 3 edges occur twice in one direction, and each of their 3 reverses has two
    // partners (non-manifold).
    const doubled = {
      positions: closed.positions,
      indices: new Uint32Array([...closed.indices, ...closed.indices.slice(0, 3)]),
    };
    expect(() => assertClosedManifold(doubled)).toThrow('3 open or non-manifold edges, 3 edges used twice');
    // One triangle turned over: each of its 3 edges now runs the same way as its neighbour's, so 3 edges occur
    // twice in one direction and 3 directed edges (the turned triangle's own) have no reverse.
    const turned = closed.indices.slice();
    [turned[1], turned[2]] = [turned[2], turned[1]];
    expect(() => assertClosedManifold({ positions: closed.positions, indices: turned })).toThrow(MeshValidationError);
    // The same mesh numbered from the other end passes: the check does not depend on vertex order.
    const reversedNumbering = closed.indices.map((v) => closed.positions.length / 3 - 1 - v);
    const reversedPositions = new Float32Array(closed.positions.length);
    for (let v = 0; v < closed.positions.length / 3; v++)
      reversedPositions.set(closed.positions.subarray(v * 3, v * 3 + 3), (closed.positions.length / 3 - 1 - v) * 3);
    expect(() => assertClosedManifold({ positions: reversedPositions, indices: reversedNumbering })).not.toThrow();
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
