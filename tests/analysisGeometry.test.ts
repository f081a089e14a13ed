import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import jscad from '@jscad/modeling';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { measureMesh } from '../shared/analysis/measureMesh';
import { meshTopology } from '../shared/analysis/meshTopology';
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { orientMesh } from '../shared/analysis/orientMesh';
import { buildPlateFit } from '../shared/analysis/buildPlateFit';
import { decodeFaceBitset } from '../shared/analysis/faceBitset';
import { box, geomToMesh, loadManifold, manifoldToMesh } from './meshFixtures';

const { primitives, extrusions, transforms } = jscad;
let wasm: Awaited<ReturnType<typeof loadManifold>>;
beforeAll(async () => {
  wasm = await loadManifold();
});

/** A prism whose x-z cross-section is `points` (counter-clockwise), `depthMm` deep along y. */
function prismXZ(points: [number, number][], depthMm: number): IndexedMesh {
  const section = primitives.polygon({ points });
  return geomToMesh(transforms.rotateX(Math.PI / 2, extrusions.extrudeLinear({ height: depthMm }, section)));
}

describe('volume and area against analytic values', () => {
  it('cube: exact', () => {
    const m = measureMesh(geomToMesh(box([0, 0, 0], [30, 20, 10])));
    expect(m.volumeMm3).toBeCloseTo(6000, 6); // analytic: 30 × 20 × 10
    expect(m.surfaceAreaMm2).toBeCloseTo(2 * (600 + 300 + 200), 6); // analytic: 2(ab + bc + ca)
  });

  it('cylinder: matches the inscribed prism exactly and converges to πr²h', () => {
    const r = 10;
    const h = 25;
    let lastError = Infinity;
    for (const n of [12, 24, 48, 96, 192]) {
      const m = measureMesh(geomToMesh(primitives.cylinder({ radius: r, height: h, segments: n })));
      // analytic: regular n-gon area (n/2) r² sin(2π/n), perimeter 2 n r sin(π/n)
      const polygon = (n / 2) * r * r * Math.sin((2 * Math.PI) / n);
      expect(m.volumeMm3).toBeCloseTo(polygon * h, 1);
      expect(m.surfaceAreaMm2).toBeCloseTo(2 * polygon + 2 * n * r * Math.sin(Math.PI / n) * h, 1);
      const error = Math.abs(m.volumeMm3 - Math.PI * r * r * h);
      expect(error).toBeLessThan(lastError);
      lastError = error;
    }
    expect(lastError / (Math.PI * r * r * h)).toBeLessThan(0.001);
  });

  it('sphere: volume and area converge to 4/3πr³ and 4πr²', () => {
    const r = 20;
    let lastVolumeError = Infinity;
    let lastAreaError = Infinity;
    for (const n of [16, 32, 64, 128]) {
      const m = measureMesh(geomToMesh(primitives.sphere({ radius: r, segments: n })));
      const volumeError = Math.abs(m.volumeMm3 / ((4 / 3) * Math.PI * r ** 3) - 1);
      const areaError = Math.abs(m.surfaceAreaMm2 / (4 * Math.PI * r * r) - 1);
      expect(volumeError).toBeLessThan(lastVolumeError);
      expect(areaError).toBeLessThan(lastAreaError);
      lastVolumeError = volumeError;
      lastAreaError = areaError;
    }
    expect(lastVolumeError).toBeLessThan(0.002);
    expect(lastAreaError).toBeLessThan(0.002);
  });
});

describe('agreement with manifold-3d', () => {
  it('box with a hole, a sphere and a hollow box: same volume and area as Manifold.volume()/surfaceArea()', () => {
    const { Manifold } = wasm;
    const solids = [
      Manifold.cube([50, 40, 30]).subtract(Manifold.cylinder(40, 8, 8, 48).translate([25, 20, -5])),
      Manifold.sphere(15, 64),
      Manifold.cube([60, 60, 60], true).subtract(Manifold.cube([54, 54, 54], true)),
      Manifold.cube([20, 20, 5]).add(Manifold.cylinder(30, 4, 2, 32).translate([10, 10, 5])),
    ];
    for (const solid of solids) {
      const mesh = manifoldToMesh(solid);
      const m = measureMesh(mesh);
      // source: manifold-3d 3.5 Manifold.volume() and Manifold.surfaceArea()
      expect(m.volumeMm3 / solid.volume()).toBeCloseTo(1, 5);
      expect(m.surfaceAreaMm2 / solid.surfaceArea()).toBeCloseTo(1, 5);
      expect(meshTopology(mesh).watertight).toBe(true); // manifold-3d output is a closed 2-manifold by contract
    }
  });
});

describe('overhang: the 45° rule', () => {
  // source: Mazlan et al. 2020 — self-supporting overhang ≤ 45° from vertical
  const H = 20;
  const wedge = (deg: number): IndexedMesh => {
    const d = H * Math.tan((deg * Math.PI) / 180);
    return prismXZ(
      [
        [0, 0],
        [5, 0],
        [5 + d, H],
        [0, H],
      ],
      10,
    );
  };

  it('a slope 44° from vertical needs no support', () => {
    const m = measureMesh(wedge(44));
    expect(m.overhangAreaMm2).toBe(0);
    expect(m.overhangFaceCount).toBe(0);
  });

  it('a slope 46° from vertical is an overhang, its whole face and nothing else', () => {
    const d = H * Math.tan((46 * Math.PI) / 180);
    const mesh = wedge(46);
    const m = measureMesh(mesh);
    expect(m.overhangAreaMm2).toBeCloseTo(Math.hypot(d, H) * 10, 3);
    // the same wedge judged at a 50° threshold passes
    expect(measureMesh(mesh, 50).overhangAreaMm2).toBe(0);
  });

  it('the support under the 46° slope is the triangle under it times the depth (analytic)', () => {
    const d = H * Math.tan((46 * Math.PI) / 180);
    const r = analyzeGeometry(wedge(46));
    expect(Math.abs(r.report.supportVolumeMm3 / (((d * H) / 2) * 10) - 1)).toBeLessThan(0.01);
  });

  it('the face bitset in the report decodes to the same faces', () => {
    const r = analyzeGeometry(wedge(46));
    const mask = decodeFaceBitset(r.report.overhang.facesBitsetBase64, r.report.triangles);
    expect(Array.from(mask)).toEqual(Array.from(r.overhangMask));
    expect(mask.reduce((a, b) => a + b, 0)).toBe(r.report.overhang.faceCount);
  });
});

describe('support volume of known overhangs', () => {
  it('T shape, cap on top: support is (cap area − stem area) × stem height (analytic)', () => {
    const { Manifold } = wasm;
    const t = Manifold.cube([10, 10, 30])
      .translate([15, 15, 0])
      .add(Manifold.cube([40, 40, 5]).translate([0, 0, 30]));
    const r = analyzeGeometry(manifoldToMesh(t)).report;
    expect(r.watertight).toBe(true);
    expect(r.supportVolumeMm3 / ((40 * 40 - 10 * 10) * 30)).toBeCloseTo(1, 2);
    expect(r.overhang.areaMm2).toBeCloseTo(1500, 3);
    expect(r.bedContactAreaMm2).toBeCloseTo(100, 3);
  });

  it('T shape upside down needs no support; its cap is the bed contact', () => {
    const { Manifold } = wasm;
    const t = Manifold.cube([10, 10, 30])
      .translate([15, 15, 0])
      .add(Manifold.cube([40, 40, 5]).translate([0, 0, 30]));
    const r = analyzeGeometry(manifoldToMesh(t), { up: '-z' }).report;
    expect(r.supportVolumeMm3).toBe(0);
    expect(r.bedContactAreaMm2).toBeCloseTo(1600, 3);
    expect(r.bbox.minMm[2]).toBeCloseTo(0, 6);
  });

  it('a shelf over a lower step: rays stop on the part below, not the plate (analytic)', () => {
    const { Manifold } = wasm;
    // base 40×20×10, wall 10×20 up to 40, shelf from x=10 to 40 at z 35..40: support from z=10 to z=35 over 30×20
    const part = Manifold.cube([40, 20, 10])
      .add(Manifold.cube([10, 20, 40]))
      .add(Manifold.cube([30, 20, 5]).translate([10, 0, 35]));
    const r = analyzeGeometry(manifoldToMesh(part)).report;
    expect(r.supportVolumeMm3 / (30 * 20 * 25)).toBeCloseTo(1, 2);
  });
});

describe('bridges', () => {
  // limits: from memory (no published bridge limit found)
  const table = (spanMm: number) => {
    const { Manifold } = wasm;
    return manifoldToMesh(
      Manifold.cube([5, 20, 15])
        .add(Manifold.cube([5, 20, 15]).translate([5 + spanMm, 0, 0]))
        .add(Manifold.cube([10 + spanMm, 20, 3]).translate([0, 0, 15])),
    );
  };

  it('a slab on two legs is a bridge with its span between the legs', () => {
    const short = analyzeGeometry(table(8)).report.bridges;
    expect(short.regions).toHaveLength(1);
    expect(short.regions[0].spanMm).toBeCloseTo(8, 4);
    expect(short.regions[0].status).toBe('ok');
    expect(analyzeGeometry(table(15)).report.bridges.regions[0].status).toBe('warn');
    const long = analyzeGeometry(table(30)).report.bridges;
    expect(long.maxSpanMm).toBeCloseTo(30, 4);
    expect(long.regions[0].status).toBe('fail');
  });

  it('a cantilever is not a bridge', () => {
    const { Manifold } = wasm;
    const l = manifoldToMesh(Manifold.cube([5, 20, 15]).add(Manifold.cube([25, 20, 3]).translate([0, 0, 15])));
    expect(analyzeGeometry(l).report.bridges.regions).toHaveLength(0);
  });
});

describe('watertight, components, thinnest wall', () => {
  const cube = geomToMesh(box([0, 0, 0], [10, 10, 10]));

  it('counts open, misoriented and non-manifold edges', () => {
    expect(meshTopology(cube)).toMatchObject({ watertight: true, openEdges: 0, components: 1 });
    const holed = { positions: cube.positions, indices: cube.indices.slice(3) };
    expect(meshTopology(holed)).toMatchObject({ watertight: false, openEdges: 3 });
    const flipped = cube.indices.slice();
    [flipped[1], flipped[2]] = [flipped[2], flipped[1]];
    expect(meshTopology({ positions: cube.positions, indices: flipped })).toMatchObject({
      watertight: false,
      misorientedEdges: 3,
    });
    const extra = new Uint32Array(cube.indices.length + 3);
    extra.set(cube.indices);
    extra.set([cube.indices[0], cube.indices[2], cube.indices[1]], cube.indices.length);
    expect(meshTopology({ positions: cube.positions, indices: extra }).nonManifoldEdges).toBe(3);
  });

  it('counts separate parts', () => {
    const two = geomToMesh(jscad.booleans.union(box([0, 0, 0], [10, 10, 10]), box([20, 0, 0], [30, 10, 10])));
    expect(meshTopology(two).components).toBe(2);
  });

  it('measures the wall of a hollow box (3 mm, analytic)', () => {
    const { Manifold } = wasm;
    const hollow = manifoldToMesh(Manifold.cube([60, 60, 60], true).subtract(Manifold.cube([54, 54, 54], true)));
    const wall = analyzeGeometry(hollow).report.thinnestWall!;
    expect(wall.minMm).toBeGreaterThan(2.99);
    expect(wall.minMm).toBeLessThan(3.01);
    expect(wall.p5Mm).toBeCloseTo(3, 3);
    expect(wall.samples).toBeGreaterThan(1000);
  });

  it('finds a thin fin on a thick block and says where it is', () => {
    const { Manifold } = wasm;
    const part = manifoldToMesh(Manifold.cube([40, 40, 10]).add(Manifold.cube([40, 1.2, 20]).translate([0, 19.4, 10])));
    const wall = analyzeGeometry(part).report.thinnestWall!;
    expect(wall.minMm).toBeCloseTo(1.2, 3);
    expect(wall.atMm[2]).toBeGreaterThan(10 - 1e-6);
  });
});

describe('build orientation and plate', () => {
  it('orients a named direction up and rests the part on z = 0, keeping volume', () => {
    const mesh = geomToMesh(box([5, 5, 5], [15, 25, 35]));
    const up = measureMesh(orientMesh(mesh, '+x'));
    expect(up.maxMm[2] - up.minMm[2]).toBeCloseTo(10, 5);
    expect(up.minMm[2]).toBeCloseTo(0, 6);
    expect(up.volumeMm3).toBeCloseTo(6000, 3);
    expect(measureMesh(orientMesh(mesh, '-y')).maxMm[2]).toBeCloseTo(20, 5);
  });

  it('keeps volume, area and the lowest point on the plate for any box in any named orientation (property)', () => {
    const dim = fc.double({ min: 1, max: 200, noNaN: true });
    fc.assert(
      fc.property(
        dim,
        dim,
        dim,
        fc.constantFrom('+z', '-z', '+x', '-x', '+y', '-y') as fc.Arbitrary<'+z'>,
        (a, b, c, up) => {
          const oriented = measureMesh(orientMesh(geomToMesh(box([3, -7, 11], [3 + a, -7 + b, 11 + c])), up));
          // analytic: a·b·c and 2(ab + bc + ca), float32 vertices: relative tolerance
          expect(oriented.volumeMm3 / (a * b * c)).toBeCloseTo(1, 4);
          expect(oriented.surfaceAreaMm2 / (2 * (a * b + b * c + c * a))).toBeCloseTo(1, 4);
          expect(oriented.minMm[2]).toBeCloseTo(0, 4);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('grid-packs copies with a spacing and turns them when that fits more', () => {
    // analytic: floor((B + s) / (f + s)) per axis
    expect(buildPlateFit([50, 50, 40], [220, 220, 250], 10)).toEqual({
      fits: true,
      copiesPerPlate: 9,
      turnedOnPlate: false,
    });
    // straight 2 × 5 = 10; turned: 6 across (6·30 + 5·10 = 230 ≤ 250) × 2 deep (2·100 + 10 = 210 ≤ 210) = 12
    expect(buildPlateFit([100, 30, 40], [250, 210, 210], 10)).toEqual({
      fits: true,
      copiesPerPlate: 12,
      turnedOnPlate: true,
    });
    expect(buildPlateFit([230, 100, 40], [250, 210, 210], 10)).toMatchObject({ fits: true, copiesPerPlate: 2 });
    expect(buildPlateFit([100, 100, 260], [256, 256, 256], 10)).toMatchObject({ fits: false, copiesPerPlate: 0 });
    expect(buildPlateFit([240, 240, 10], [220, 220, 250], 10).fits).toBe(false);
  });
});
