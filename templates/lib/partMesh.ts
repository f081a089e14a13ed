import type { IndexedMesh } from '../../shared/schemas/mesh';
import { inKernel } from './kernelClock';
import type { Solid } from './Solid';

/**
 * Copies a finished kernel solid straight into the neutral indexed mesh (outward winding, one triangle per face),
 * with no detour through another geometry type. The kernel groups triangles in runs, one per input solid, ordered
 * by the inputs' serial numbers; those depend on the order solids were made in, which differs when a sub-solid comes
 * from the cache. So the runs are put in an order of their own geometry (the first triangle's corners), and vertices
 * are numbered in order of first use, the numbering a weld of the triangles would give: the mesh (and its hash)
 * depends only on the triangles, never on whether a sub-solid was reused.
 * @param solid - the finished part (non-empty and valid)
 * @throws Error when the kernel reports the solid invalid
 */
export function partMesh(solid: Solid): IndexedMesh {
  const { vertProperties, triVerts, numProp, runIndex } = inKernel(() => {
    const status = solid.manifold.status();
    if (status !== 'NoError') throw new Error(`Geometry kernel error: ${status}`);
    return solid.manifold.getMesh();
  });
  const renumber = new Int32Array(vertProperties.length / numProp).fill(-1);
  const indices = new Uint32Array(triVerts.length);
  // At most one position per kernel vertex; trimmed to the vertices used.
  const positions = new Float32Array(renumber.length * 3);
  let used = 0;
  let i = 0;
  for (const [from, to] of runsInGeometricOrder(runIndex, triVerts, vertProperties, numProp))
    for (let k = from; k < to; k++, i++) {
      const v = triVerts[k];
      if (renumber[v] < 0) {
        renumber[v] = used;
        const from = v * numProp;
        positions[used * 3] = vertProperties[from];
        positions[used * 3 + 1] = vertProperties[from + 1];
        positions[used * 3 + 2] = vertProperties[from + 2];
        used++;
      }
      indices[i] = renumber[v];
    }
  return { positions: used * 3 === positions.length ? positions : positions.slice(0, used * 3), indices };
}

/** The runs' [start, end) ranges in triVerts, ordered by the coordinates of each run's first triangle. */
function runsInGeometricOrder(
  runIndex: Uint32Array | undefined,
  triVerts: Uint32Array,
  vertProperties: Float32Array,
  numProp: number,
): [number, number][] {
  const runs: [number, number][] = [];
  if (!runIndex || runIndex.length < 2) return [[0, triVerts.length]];
  for (let r = 0; r + 1 < runIndex.length; r++)
    if (runIndex[r + 1] > runIndex[r]) runs.push([runIndex[r], runIndex[r + 1]]);
  if (runs.length < 2) return runs;
  const corner = (run: [number, number], c: number): number =>
    vertProperties[triVerts[run[0] + Math.floor(c / 3)] * numProp + (c % 3)];
  return runs.sort((a, b) => {
    for (let c = 0; c < 9; c++) {
      const d = corner(a, c) - corner(b, c);
      if (d !== 0) return d;
    }
    return a[1] - a[0] - (b[1] - b[0]);
  });
}

/**
 * The mesh with its vertices numbered in order of first use by its triangles (the numbering a weld of the triangles
 * gives, as {@link partMesh} makes it) and unused vertices left out; for meshes finished in JS after the kernel.
 * @param mesh - any indexed mesh
 */
export function numberByFirstUse({ positions, indices }: IndexedMesh): IndexedMesh {
  const renumber = new Int32Array(positions.length / 3).fill(-1);
  const out = new Uint32Array(indices.length);
  const xyz = new Float32Array(positions.length);
  let used = 0;
  for (let k = 0; k < indices.length; k++) {
    const v = indices[k];
    if (renumber[v] < 0) {
      renumber[v] = used;
      xyz[used * 3] = positions[v * 3];
      xyz[used * 3 + 1] = positions[v * 3 + 1];
      xyz[used * 3 + 2] = positions[v * 3 + 2];
      used++;
    }
    out[k] = renumber[v];
  }
  return { positions: used * 3 === xyz.length ? xyz : xyz.slice(0, used * 3), indices: out };
}
