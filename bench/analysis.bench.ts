/**
 * Speed of the print-readiness engine: the linear pass (volume, area, overhang) on a 1-million-triangle mesh
 * (target ≥ 10 M triangles/s on one core), support ray casting (rays/s), the orientation search on a
 * 100k-triangle mesh (target < 2 s), plus reading a binary STL and the edge topology for scale.
 */
import Module from 'manifold-3d';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { measureMesh } from '../shared/analysis/measureMesh';
import { meshTopology } from '../shared/analysis/meshTopology';
import { orientMesh } from '../shared/analysis/orientMesh';
import { supportVolume } from '../shared/analysis/supportVolume';
import { searchOrientation } from '../shared/analysis/searchOrientation';
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { parseStl } from '../shared/mesh/parseStl';

type Solid = { getMesh(): { numProp: number; vertProperties: Float32Array; triVerts: Uint32Array }; numTri(): number };

function toMesh(solid: Solid): IndexedMesh {
  const m = solid.getMesh();
  const count = m.vertProperties.length / m.numProp;
  const positions = new Float32Array(count * 3);
  for (let i = 0; i < count; i++)
    for (let d = 0; d < 3; d++) positions[i * 3 + d] = m.vertProperties[i * m.numProp + d];
  return { positions, indices: Uint32Array.from(m.triVerts) };
}

function toBinaryStl(mesh: IndexedMesh): Uint8Array {
  const n = mesh.indices.length / 3;
  const bytes = new Uint8Array(84 + 50 * n);
  const view = new DataView(bytes.buffer);
  bytes.set(new TextEncoder().encode('nestwright bench'), 0);
  view.setUint32(80, n, true);
  for (let t = 0; t < n; t++) {
    for (let k = 0; k < 3; k++) {
      const v = mesh.indices[t * 3 + k];
      for (let d = 0; d < 3; d++) view.setFloat32(84 + t * 50 + 12 + k * 12 + d * 4, mesh.positions[v * 3 + d], true);
    }
  }
  return bytes;
}

/** Best of `runs` timings, in ms. */
function best(runs: number, fn: () => void): number {
  let min = Infinity;
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    min = Math.min(min, performance.now() - t0);
  }
  return min;
}

const fmt = (n: number): string => n.toLocaleString('en-GB', { maximumFractionDigits: 1 });

/** Prints the analysis engine's figures. */
export default async function bench(): Promise<void> {
  const wasm = await Module();
  wasm.setup();
  const { Manifold } = wasm;

  // A T shape (stem under a wide cap: a large overhang), refined to about 1 M and 100 k triangles.
  const tShape = Manifold.cube([20, 20, 60])
    .translate([30, 30, 0])
    .add(Manifold.cube([80, 80, 10]).translate([0, 0, 60]));
  const big = toMesh(tShape.refine(Math.ceil(Math.sqrt(1_000_000 / tShape.numTri()))));
  const mid = toMesh(tShape.refine(Math.ceil(Math.sqrt(100_000 / tShape.numTri()))));
  const bigTris = big.indices.length / 3;
  const midTris = mid.indices.length / 3;

  const linearMs = best(5, () => measureMesh(big, 45));
  console.log(
    `linear pass (volume, area, bbox, overhang, bed contact): ${fmt(bigTris)} triangles in ${fmt(linearMs)} ms = ${fmt(bigTris / linearMs / 1000)} M triangles/s (target ≥ 10)`,
  );

  const topoMs = best(2, () => meshTopology(big));
  console.log(
    `edge topology + components: ${fmt(bigTris)} triangles in ${fmt(topoMs)} ms = ${fmt(bigTris / topoMs / 1000)} M triangles/s`,
  );

  const stl = toBinaryStl(big);
  const parseMs = best(2, () => parseStl(stl));
  console.log(`binary STL read + weld: ${fmt(stl.length / 1e6)} MB in ${fmt(parseMs)} ms`);

  const m = measureMesh(big, 45);
  let rays = 0;
  const supportMs = best(3, () => {
    rays = supportVolume(big, m.overhangMask, m.minMm, m.maxMm, { maxRays: 400_000 }).rays;
  });
  console.log(
    `support rays (grid bins + build): ${fmt(rays)} rays in ${fmt(supportMs)} ms = ${fmt(rays / supportMs / 1000)} M rays/s on ${fmt(bigTris)} triangles`,
  );

  let label = '';
  const searchMs = best(2, () => {
    label = searchOrientation(mid).best.label;
  });
  console.log(
    `orientation search, 26 candidates: ${fmt(midTris)} triangles in ${fmt(searchMs)} ms (target < 2000); best: ${label}`,
  );

  const fullMs = best(1, () => analyzeGeometry(orientMesh(mid, '+z')));
  console.log(
    `full geometry report (support 200k rays, 20k wall rays): ${fmt(midTris)} triangles in ${fmt(fullMs)} ms`,
  );
}
