import { beforeAll, describe, expect, it } from 'vitest';
import { generate } from '../templates/index';
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { searchOrientation } from '../shared/analysis/searchOrientation';
import { loadManifold } from './meshFixtures';

let wasm: Awaited<ReturnType<typeof loadManifold>>;
beforeAll(async () => {
  wasm = await loadManifold();
});

describe('analysis of template meshes', () => {
  it.each(['gable-box', 'round-pod'])('%s: volume and area agree with manifold-3d', async (id) => {
    const { mesh } = await generate(id, {});
    const { Manifold, Mesh } = wasm;
    const solid = new Manifold(new Mesh({ numProp: 3, vertProperties: mesh.positions, triVerts: mesh.indices }));
    const r = analyzeGeometry(mesh, { supportMaxRays: 20_000, wallSamples: 2_000 }).report;
    // source: manifold-3d 3.5 Manifold.volume() / surfaceArea()
    expect(r.volumeMm3 / solid.volume()).toBeCloseTo(1, 5);
    expect(r.surfaceAreaMm2 / solid.surfaceArea()).toBeCloseTo(1, 5);
    expect(r.watertight).toBe(true);
    solid.delete();
  });

  it('the gable box comes out roof-down, as its template prints it, with far less support than upright', async () => {
    const { mesh } = await generate('gable-box', {});
    const s = searchOrientation(mesh, { maxRaysPerCandidate: 10_000 });
    // the template is built roof-down (ridge strip on the plate, roof pitch ≥ 45°): 'face -z down' is as built
    expect(s.best.label).toBe('face -z down');
    const upright = s.candidates.find((c) => c.label === 'face +z down')!;
    expect(upright.supportVolumeMm3).toBeGreaterThan(10 * s.best.supportVolumeMm3);
  });
});
