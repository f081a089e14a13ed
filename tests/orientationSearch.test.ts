import { beforeAll, describe, expect, it } from 'vitest';
import { searchOrientation } from '../shared/analysis/searchOrientation';
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { loadManifold, manifoldToMesh } from './meshFixtures';

let wasm: Awaited<ReturnType<typeof loadManifold>>;
beforeAll(async () => {
  wasm = await loadManifold();
});

describe('searchOrientation', () => {
  it('scores 26 candidates (6 faces, 12 edges, 8 corners), best first, each with a reason', () => {
    const s = searchOrientation(manifoldToMesh(wasm.Manifold.cube([30, 20, 10])));
    expect(s.candidates).toHaveLength(26);
    expect(new Set(s.candidates.map((c) => c.label)).size).toBe(26);
    expect(s.candidates.filter((c) => c.kind === 'edge')).toHaveLength(12);
    expect(s.candidates.filter((c) => c.kind === 'corner')).toHaveLength(8);
    expect(s.candidates.every((c) => c.reason.length > 0)).toBe(true);
    expect(s.candidates.map((c) => c.rank)).toEqual(Array.from({ length: 26 }, (_, i) => i + 1));
  });

  it('puts a flat box on its largest face: no support, lowest height (analytic)', () => {
    const s = searchOrientation(manifoldToMesh(wasm.Manifold.cube([30, 20, 10])));
    expect(s.best.kind).toBe('face');
    expect(s.best.supportVolumeMm3).toBe(0);
    expect(s.best.heightMm).toBeCloseTo(10, 4);
    // a box on an edge has its lower faces at exactly 45°: within the rule, so no support, but it is taller
    const edge = s.candidates.find((c) => c.kind === 'edge')!;
    expect(edge.heightMm).toBeGreaterThan(10);
  });

  it('turns a T (mushroom) shape cap-down: the cap carries the stem and nothing overhangs', () => {
    // cap on top as modelled: upright it needs (40² − 10²) × 30 mm³ of support (analytic)
    const t = wasm.Manifold.cube([10, 10, 30])
      .translate([15, 15, 0])
      .add(wasm.Manifold.cube([40, 40, 5]).translate([0, 0, 30]));
    const mesh = manifoldToMesh(t);
    const s = searchOrientation(mesh);
    expect(s.best.label).toBe('face +z down');
    expect(s.best.supportVolumeMm3).toBe(0);
    expect(s.best.bedContactAreaMm2).toBeCloseTo(1600, 2);
    const upright = s.candidates.find((c) => c.label === 'face -z down')!;
    expect(upright.supportVolumeMm3 / (1500 * 30)).toBeCloseTo(1, 1);
    expect(upright.reason).toMatch(/more support/);
    // the rotation it returns gives the same result when passed back
    const again = analyzeGeometry(mesh, { up: { rotation: s.best.rotation } }).report;
    expect(again.supportVolumeMm3).toBe(0);
    expect(again.bbox.sizeMm[2]).toBeCloseTo(35, 4);
  });

  it('lays an L bracket flat on its side: no support and the lowest height (analytic: its 20 mm depth)', () => {
    // L: foot 60 × 20 × 5, upright 5 × 20 × 40. On the foot (height 40) or its back (height 60) nothing overhangs
    // either; on its side the L outline lies on the plate and the part is only 20 mm tall.
    const l = wasm.Manifold.cube([60, 20, 5]).add(wasm.Manifold.cube([5, 20, 40]));
    const s = searchOrientation(manifoldToMesh(l));
    expect(s.best.supportVolumeMm3).toBe(0);
    expect(s.best.heightMm).toBeCloseTo(20, 4);
    expect(['face -y down', 'face +y down']).toContain(s.best.label);
    expect(s.candidates.find((c) => c.label === 'face -z down')!.reason).toMatch(/same support, 20\.0 mm taller/);
  });

  it('ranks a hollow box standing on a corner last although its cavity then needs no support', () => {
    // on a corner every inner face is 35° from vertical (< 45°, no support) but the part rests on a point
    const hollow = manifoldToMesh(
      wasm.Manifold.cube([50, 50, 50]).subtract(wasm.Manifold.cube([44, 44, 44]).translate([3, 3, 3])),
    );
    const s = searchOrientation(hollow);
    expect(s.best.kind).toBe('face');
    expect(s.best.label).toBe('face -z down'); // all faces tie: the part stays as modelled
    const corner = s.candidates.find((c) => c.kind === 'corner')!;
    expect(corner.supportVolumeMm3).toBe(0);
    expect(corner.reason).toMatch(/unstable/);
    expect(s.candidates.slice(-8).every((c) => c.kind === 'corner' || c.kind === 'edge')).toBe(true);
  });
});
