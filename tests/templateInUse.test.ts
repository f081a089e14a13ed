/**
 * What a template says about itself in use: how its body stands (spec-sheet drawings and the shop's model) and what
 * its back fits. The body is built in the drawing worker thread; the bytes must equal a build on this thread.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { productMesh } from '../server/services/specSheetMesh';
import { backFit } from '../server/services/specSheet';
import { closeProductMeshWorker, productMeshInWorker } from '../server/workers/ProductMeshWorker';
import { TEMPLATES } from '../templates/index';
import { TemplateParamError } from '../templates/lib/TemplateParamError';
import type { IndexedMesh } from '../shared/schemas/mesh';

afterAll(closeProductMeshWorker);

/** Width across x of the vertices in a horizontal band of the mesh, as a share of the overall width. */
function bandWidthShare(mesh: IndexedMesh, fromShare: number, toShare: number): number {
  const p = mesh.positions;
  let minX = Infinity,
    maxX = -Infinity,
    maxZ = -Infinity;
  for (let i = 0; i < p.length; i += 3) {
    minX = Math.min(minX, p[i]);
    maxX = Math.max(maxX, p[i]);
    maxZ = Math.max(maxZ, p[i + 2]);
  }
  let lo = Infinity,
    hi = -Infinity;
  for (let i = 0; i < p.length; i += 3) {
    const z = p[i + 2] / maxZ;
    if (z < fromShare || z > toShare) continue;
    lo = Math.min(lo, p[i]);
    hi = Math.max(hi, p[i]);
  }
  return (hi - lo) / (maxX - minX);
}

describe('how a body stands in use', () => {
  it.each(TEMPLATES.map((t) => t.id))(
    '%s: the worker builds the same standing body as this thread',
    async (id) => {
      const [here, there] = await Promise.all([productMesh(id, {}), productMeshInWorker(id, {})]);
      expect(Buffer.from(there.mesh.positions.buffer)).toEqual(Buffer.from(here.mesh.positions.buffer));
      expect(Array.from(there.mesh.indices)).toEqual(Array.from(here.mesh.indices));
      expect(there.templateVersion).toBe(here.templateVersion);
    },
    60_000,
  );

  it('the gable box, printed roof-down, stands roof-up: its ridge is the narrow top and its walls the wide bottom', async () => {
    // A pitched roof narrows to its ridge, so the highest tenth of a standing gable box is far narrower than its
    // lowest tenth (geometry of a pitched roof; common practice, no outside source needed).
    const { mesh } = await productMeshInWorker('gable-box', {});
    expect(bandWidthShare(mesh, 0.9, 1)).toBeLessThan(0.5);
    expect(bandWidthShare(mesh, 0, 0.1)).toBeGreaterThan(0.6);
  }, 60_000);

  it('a parameter the template refuses comes back from the worker as the same error, naming the field', async () => {
    const err = await productMeshInWorker('gable-box', { entryHoleDiameterMm: 500 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(TemplateParamError);
    expect((err as TemplateParamError).field).toBe('entryHoleDiameterMm');
    expect((err as Error).message).toMatch(/Entry-hole diameter must be between/);
  });
});

describe('what the back fits', () => {
  it('a bark trunk shaped to a 150 mm radius fits a 300 mm (11.8 in) trunk; with a flat back, a post or wall', () => {
    // 300 mm / 25.4 mm per inch = 11.81 in (inch as defined by the international yard and pound agreement, 1959).
    const concave = backFit('bark-trunk', { mountRadiusMm: 150, flatBack: false }, 200);
    expect(concave).toMatch(/^Concave back shaped for a trunk or pole of 300 mm \(11\.8\d* in\) diameter/);
    const flat = backFit('bark-trunk', { mountRadiusMm: 150, flatBack: true }, 200);
    expect(flat).toMatch(/^Flat back, 200 mm \(7\.87\d* in\) wide overall/);
  });

  it('a round pod has no back: it hangs from its eye, or needs a bracket without one', () => {
    expect(backFit('round-pod', { hangingHole: true }, 150)).toMatch(/hangs by wire from its eye/);
    expect(backFit('round-pod', { hangingHole: false }, 150)).toMatch(/bracket of your own/);
  });

  it('an unknown template is refused in words', () => {
    expect(() => backFit('no-such', {}, 100)).toThrow(/There is no template called "no-such"/);
  });
});
