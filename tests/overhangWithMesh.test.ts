/**
 * The preview tints overhangs from flags computed with the mesh in the geometry worker; the figures compute them
 * again in their analysis. Both must flag the same faces, or the tint would change when the figures arrive.
 */
import { describe, expect, it } from 'vitest';
import { generate, generateDraft } from '../templates/generate';
import { TEMPLATES } from '../templates/index';
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { measureDesign } from '../shared/assessment/assessDesign';
import { overhangMaskOf } from '../shared/analysis/overhangMask';
import { loadManifold, manifoldToMesh } from './meshFixtures';

describe('overhang flags sent with the mesh', () => {
  it.each(TEMPLATES.map((t) => t.id))(
    '%s: the full and the draft build flag the same faces as the analysis behind the figures',
    async (id) => {
      const full = await generate(id, {});
      const draft = await generateDraft(id, {});
      for (const mesh of [full.mesh, draft.mesh]) {
        const withMesh = overhangMaskOf(mesh);
        const { overhangMask } = measureDesign(mesh, { geometry: { up: '+z' } });
        expect(withMesh).toEqual(overhangMask);
        expect(withMesh.length).toBe(mesh.indices.length / 3);
      }
    },
    60_000,
  );

  it('flags the underside of a block held above the plate by a post, and none of a block resting on it', async () => {
    // Worked by hand (common practice: faces facing down more than 45° from vertical need support): a 20 mm cube
    // standing on the plate has only bed contact below; a 40 × 40 × 10 mm slab on a 10 mm post has its underside
    // (40 × 40 − 10 × 10 = 1,500 mm²) as overhang. manifold-3d builds the solids.
    const { Manifold } = await loadManifold();
    const cube = manifoldToMesh(Manifold.cube([20, 20, 20]));
    expect(overhangMaskOf(cube).reduce((n, f) => n + f, 0)).toBe(0);
    const table = Manifold.cube([10, 10, 30]).add(Manifold.cube([40, 40, 10]).translate([-15, -15, 30]));
    const mesh = manifoldToMesh(table);
    const mask = overhangMaskOf(mesh);
    const report = analyzeGeometry(mesh).report;
    expect(report.overhang.areaMm2).toBeCloseTo(1_500, 6);
    expect(mask).toEqual(analyzeGeometry(mesh).overhangMask);
    expect(mask.reduce((n, f) => n + f, 0)).toBeGreaterThan(0);
  });
});
