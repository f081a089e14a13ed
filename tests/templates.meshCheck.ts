/**
 * Outside checks of template meshes shared by the template and export tests: manifold-3d (status, volume, bodies)
 * and Debian's admesh on the written STL (open edges, parts, reversed facets).
 */
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import Module from 'manifold-3d';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { writeStl } from '../shared/mesh/writeStl';

const run = promisify(execFile);
const wasm = Module().then((m) => {
  m.setup();
  return m;
});

/** What manifold-3d says about a mesh. */
export interface ManifoldReport {
  status: string;
  volumeMm3: number;
  bodies: number;
  genus: number;
}

/**
 * Builds a manifold-3d solid from the mesh exactly as given (no merging) and reports its status, volume and the
 * number of separate bodies. source: manifold-3d (outside library) — status NoError means closed and 2-manifold.
 * @param mesh - the mesh to check
 */
export async function manifoldReport(mesh: IndexedMesh): Promise<ManifoldReport> {
  const { Manifold, Mesh } = await wasm;
  const solid = new Manifold(new Mesh({ numProp: 3, vertProperties: mesh.positions, triVerts: mesh.indices }));
  try {
    const status = solid.status();
    if (status !== 'NoError') return { status, volumeMm3: 0, bodies: 0, genus: 0 };
    const bodies = solid.decompose();
    const report = { status, volumeMm3: solid.volume(), bodies: bodies.length, genus: solid.genus() };
    for (const body of bodies) body.delete();
    return report;
  } finally {
    solid.delete();
  }
}

/** What admesh reports for an STL file. */
export interface AdmeshReport {
  facets: number;
  disconnectedFacets: number;
  edgesFixed: number;
  facetsReversed: number;
  backwardsEdges: number;
  parts: number;
  volumeMm3: number;
}

function field(text: string, label: string): number {
  const match = new RegExp(`${label.replace(/[()]/g, '\\$&')}\\s*:\\s*(-?[\\d.]+)(?:\\s+(-?[\\d.]+))?`).exec(text);
  if (!match) throw new Error(`admesh output has no "${label}"`);
  return Number(match[2] ?? match[1]);
}

/**
 * Writes the mesh as binary STL and runs `admesh --exact --normal-directions` on it (checks only perfectly
 * matching edges, so nothing is "fixed" by tolerance). source: Debian's admesh 0.98.
 * @param mesh - the mesh to check
 */
export async function admeshReport(mesh: IndexedMesh): Promise<AdmeshReport> {
  const dir = await mkdtemp(join(tmpdir(), 'nw-admesh-'));
  try {
    const file = join(dir, 'mesh.stl');
    await writeFile(file, writeStl(mesh));
    const { stdout } = await run('admesh', ['--exact', '--normal-directions', file]);
    return {
      facets: field(stdout, 'Number of facets'),
      disconnectedFacets: field(stdout, 'Total disconnected facets'),
      edgesFixed: field(stdout, 'Edges fixed'),
      facetsReversed: field(stdout, 'Facets reversed'),
      backwardsEdges: field(stdout, 'Backwards edges'),
      parts: field(stdout, 'Number of parts'),
      volumeMm3: field(stdout, 'Volume'),
    };
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** Per-triangle area and unit normal, computed here (not by the code under test). */
export function triangleFacets(
  mesh: IndexedMesh,
): { areaMm2: number; nx: number; ny: number; nz: number; minZ: number; cx: number; cy: number; cz: number }[] {
  const p = mesh.positions;
  const out = [];
  for (let t = 0; t < mesh.indices.length; t += 3) {
    const a = mesh.indices[t] * 3;
    const b = mesh.indices[t + 1] * 3;
    const c = mesh.indices[t + 2] * 3;
    const ux = p[b] - p[a],
      uy = p[b + 1] - p[a + 1],
      uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a],
      vy = p[c + 1] - p[a + 1],
      vz = p[c + 2] - p[a + 2];
    const nx = uy * vz - uz * vy,
      ny = uz * vx - ux * vz,
      nz = ux * vy - uy * vx;
    const len = Math.hypot(nx, ny, nz);
    if (len === 0) continue;
    out.push({
      areaMm2: len / 2,
      nx: nx / len,
      ny: ny / len,
      nz: nz / len,
      minZ: Math.min(p[a + 2], p[b + 2], p[c + 2]),
      cx: (p[a] + p[b] + p[c]) / 3,
      cy: (p[a + 1] + p[b + 1] + p[c + 1]) / 3,
      cz: (p[a + 2] + p[b + 2] + p[c + 2]) / 3,
    });
  }
  return out;
}
