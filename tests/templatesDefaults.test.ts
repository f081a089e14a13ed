/**
 * Every template is print-ready at its defaults: each part fits the default farm printers in its build orientation,
 * the entry sits exactly at the "hole height above floor" parameter (facts and mesh agree), combinations the geometry
 * cannot honour are rejected by name, and the defaults raise no blocking bird-fit warning except the ones that are
 * true for a printed PLA box. Also the shared part-fit rule the editor, the analysis and the families job use.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { assessBirdFit } from '../shared/birdfit/assessBirdFit';
import { analyzeMesh } from '../shared/analysis/analyzeMesh';
import { componentSizesMm } from '../shared/analysis/fitParts';
import { buildPlateFit } from '../shared/analysis/buildPlateFit';
import { fitParts, fitPartSizes } from '../shared/analysis/fitParts';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { computeDesignFigures } from '../src/workers/computeDesignFigures';
import { TEMPLATES, TemplateParamError, generate } from '../templates/index';

const volume = (id: string): [number, number, number] => {
  const printer = DEFAULT_PRINTERS.find((p) => p.id === id);
  if (!printer) throw new Error(`no printer ${id}`);
  return [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z];
};

describe('fitPartSizes (shared part-fit rule)', () => {
  it('equals the grid count n = floor((B + s) / (f + s)) per axis for a single part', () => {
    // source: analytic grid packing formula (the rule buildPlateFit documents)
    fc.assert(
      fc.property(
        fc.tuple(fc.integer({ min: 5, max: 300 }), fc.integer({ min: 5, max: 300 }), fc.integer({ min: 5, max: 300 })),
        fc.constantFrom(...DEFAULT_PRINTERS.map((p) => p.id)),
        (size, printerId) => {
          const single = buildPlateFit(size, volume(printerId));
          const parts = fitPartSizes([size], volume(printerId));
          expect(parts.fits).toBe(single.fits);
          expect(parts.copiesPerPlate).toBe(single.copiesPerPlate);
        },
      ),
      { numRuns: 300, seed: 3 },
    );
  });

  it('packs complete sets by hand-checked counts', () => {
    // Two 100 × 100 parts with 10 mm gaps on a 220 × 220 plate: a 2 × 2 grid holds 4 parts = 2 sets (analytic).
    expect(
      fitPartSizes(
        [
          [100, 100, 50],
          [100, 100, 10],
        ],
        [220, 220, 250],
      ),
    ).toMatchObject({ fits: true, setsPerPlate: 2, copiesPerPlate: 2 });
    // A 190 × 165 body and a 140 × 140 plug on 256 × 256: side by side 190 + 10 + 140 = 340 and stacked
    // 165 + 10 + 140 = 315, both over 256, so no set fits one plate; each part fits alone (1 body per plate).
    const apart = fitPartSizes(
      [
        [190, 165, 240],
        [140, 140, 18],
      ],
      [256, 256, 256],
    );
    expect(apart).toMatchObject({ fits: true, setsPerPlate: 0, copiesPerPlate: 1, heightMm: 240 });
    // A part taller than the build height does not fit, whatever its footprint.
    expect(
      fitPartSizes(
        [
          [100, 100, 260],
          [50, 50, 10],
        ],
        [256, 256, 256],
      ).fits,
    ).toBe(false);
  });
});

describe('analyzeMesh plate fit with known parts', () => {
  it('fits the gable box part by part where the side-by-side layout as a whole is too wide', async () => {
    const result = await generate('gable-box', {});
    const printer = DEFAULT_PRINTERS.find((p) => p.id === 'rowan-farm-06')!;
    const options = {
      printer,
      material: DEFAULT_MATERIALS[0],
      settings: DEFAULT_SETTINGS,
      rates: DEFAULT_RATES,
      geometry: { supportMaxRays: 20_000, wallSamples: 200 },
    };
    const whole = analyzeMesh(result.mesh, options).report;
    // body 182 mm + 10 mm gap + plug 132 mm laid side by side: over the 246 mm plate as one block (measured layout)
    expect(whole.bbox.sizeMm[0]).toBeGreaterThan(printer.buildVolumeMm.x);
    const parts = analyzeMesh(result.mesh, { ...options, partTriangles: result.partTriangles }).report;
    expect(parts.buildPlate.fits).toBe(true);
    expect(parts.buildPlate.copiesPerPlate).toBeGreaterThanOrEqual(1);
    expect(parts.warnings.join(' ')).not.toMatch(/does not fit/);
    // An exported file does not say where one part ends: its connected parts are fitted the same way.
    expect(whole.components).toBe(2);
    expect(whole.buildPlate).toMatchObject({
      fits: parts.buildPlate.fits,
      copiesPerPlate: parts.buildPlate.copiesPerPlate,
    });
  }, 60_000);

  it('ignores the inner shell of a hollow part when fitting connected parts', () => {
    // A 200 mm cube with a 180 mm cavity has two shells; the inner one takes no plate space, so the part fits a
    // 220 mm plate once (analytic: floor((220 + 10) / (200 + 10)) = 1 per axis).
    expect(componentSizesMm(hollowCube(200, 180))).toEqual([[200, 200, 200]]);
  });
});

/** First hit of a ray along +y from y = -1000 at (x, z), by Möller–Trumbore over every triangle; null when none. */
function firstHitY(mesh: IndexedMesh, first: number, count: number, x: number, z: number): number | null {
  const p = mesh.positions;
  let best: number | null = null;
  for (let t = first; t < first + count; t++) {
    const a = mesh.indices[t * 3] * 3;
    const b = mesh.indices[t * 3 + 1] * 3;
    const c = mesh.indices[t * 3 + 2] * 3;
    const e1 = [p[b] - p[a], p[b + 1] - p[a + 1], p[b + 2] - p[a + 2]];
    const e2 = [p[c] - p[a], p[c + 1] - p[a + 1], p[c + 2] - p[a + 2]];
    // direction d = (0, 1, 0): h = d × e2, det = e1 · h
    const h = [e2[2], 0, -e2[0]];
    const det = e1[0] * h[0] + e1[2] * h[2];
    if (Math.abs(det) < 1e-12) continue;
    const s = [x - p[a], -1000 - p[a + 1], z - p[a + 2]];
    const u = (s[0] * h[0] + s[2] * h[2]) / det;
    if (u < 0 || u > 1) continue;
    const q = [s[1] * e1[2] - s[2] * e1[1], s[2] * e1[0] - s[0] * e1[2], s[0] * e1[1] - s[1] * e1[0]];
    const v = q[1] / det;
    if (v < 0 || u + v > 1) continue;
    const dist = (e2[0] * q[0] + e2[1] * q[1] + e2[2] * q[2]) / det;
    if (dist < 0) continue;
    const y = -1000 + dist;
    if (best === null || y < best) best = y;
  }
  return best;
}

describe.each(TEMPLATES.map((t) => [t.id] as const))('template %s at its defaults', (id) => {
  it('fits every default farm printer part by part, in the editor figures too', async () => {
    const result = await generate(id, {});
    // Every demo profile is at least 258 mm tall: the tallest default part, the bark trunk, is 252 mm with its
    // hanging tab over a 160 mm chamber (measured), and the gable box prints roof-down at about 249 mm.
    for (const printerId of DEFAULT_PRINTERS.map((p) => p.id)) {
      const fit = fitParts(result.mesh, result.partTriangles, volume(printerId));
      expect(fit.fits, `${id} on ${printerId}: ${JSON.stringify(fit.partSizesMm)}`).toBe(true);
      expect(fit.copiesPerPlate).toBeGreaterThanOrEqual(1);
      const printer = DEFAULT_PRINTERS.find((p) => p.id === printerId)!;
      const material = DEFAULT_MATERIALS[0];
      const choice = {
        printer,
        material,
        colour: material.colours[0],
        settings: DEFAULT_SETTINGS,
        rates: DEFAULT_RATES,
      };
      expect(computeDesignFigures(result, choice).figures.fitsPrinter).toBe(true);
    }
  }, 60_000);

  it('puts the entry exactly at the hole-height parameter (facts and mesh)', async () => {
    const upright = id !== 'gable-box';
    // Upright templates: without the floor plug the floor is solid at the centre, so a ray finds it.
    const result = await generate(id, upright ? { cleaningAccess: false } : {});
    const param = result.params.holeAboveFloorMm as number;
    expect(result.facts.holeAboveFloorMm).toBeCloseTo(param, 6);
    const bodyTriangles = result.partTriangles[0];
    const r = (result.params.entryHoleDiameterMm as number) / 2;
    let topZ = -Infinity;
    for (let i = 0; i < bodyTriangles * 3; i++)
      topZ = Math.max(topZ, result.mesh.positions[result.mesh.indices[i] * 3 + 2]);
    // Floor of the cavity in print coordinates. The gable prints roof-down: its open bottom is the body's top and the
    // floor is the plug's 8 mm boss (PLUG_BOSS_MM in templates/gableBox.ts) inside it.
    const floorZ = upright ? floorTopAtCentre(result.mesh, bodyTriangles) : topZ - 8;
    // Hole bottom: bisect on z for the edge where the +y ray at x = 0 stops passing through the front wall
    // (passing = the first hit lies in the back half, y > 0).
    const passes = (z: number): boolean => (firstHitY(result.mesh, 0, bodyTriangles, 0, z) ?? 1) > 0;
    const centreZ = upright ? floorZ + param + r : floorZ - param - r;
    expect(passes(centreZ)).toBe(true);
    let blocked = upright ? floorZ + 1 : floorZ - 1;
    let open = centreZ;
    expect(passes(blocked)).toBe(false);
    for (let i = 0; i < 40; i++) {
      const mid = (blocked + open) / 2;
      if (passes(mid)) open = mid;
      else blocked = mid;
    }
    const measuredMm = Math.abs(open - floorZ);
    // Tolerance 0.5 mm: the teardrop's pointed edge is a polygon of 48 segments (template geometry, analytic bound).
    expect(Math.abs(measuredMm - param), `${id}: hole bottom ${measuredMm.toFixed(2)} mm vs ${param} mm`).toBeLessThan(
      0.5,
    );
  }, 60_000);

  it('raises no blocking bird-fit warning except thin walls', async () => {
    const result = await generate(id, {});
    const blocking = assessBirdFit(result.facts)
      .warnings.filter((w) => w.severity === 'warning')
      .map((w) => w.code);
    // 'thin-walls' is true for every printed PLA box: 10 mm of PLA is thinner than the 15–19 mm wood that guidance
    // asks for (BTO essential guide; Cornell NestWatch), so it stays and says how to compensate.
    expect(blocking.filter((code) => code !== 'thin-walls')).toEqual([]);
  }, 60_000);

  it('rejects an entry too high for the cavity by field and range, never moving it silently', async () => {
    // 220 mm is the declared maximum; at the default cavity the entry would cut into the roof.
    await expect(generate(id, { holeAboveFloorMm: 220 })).rejects.toThrow(TemplateParamError);
    await expect(generate(id, { holeAboveFloorMm: 220 })).rejects.toThrow(
      /^Hole height above floor must be between 60 and \d+(\.\d)? mm for /,
    );
  });
});

/** Height of the cavity floor at the centre line (x = 0, y = 0): the highest upward-facing surface below mid-height. */
function floorTopAtCentre(mesh: IndexedMesh, triangles: number): number {
  const p = mesh.positions;
  let best = -Infinity;
  for (let t = 0; t < triangles; t++) {
    const [a, b, c] = [mesh.indices[t * 3] * 3, mesh.indices[t * 3 + 1] * 3, mesh.indices[t * 3 + 2] * 3];
    // barycentric test of (0, 0) in the triangle's x-y projection
    const d = (p[b + 1] - p[c + 1]) * (p[a] - p[c]) + (p[c] - p[b]) * (p[a + 1] - p[c + 1]);
    if (Math.abs(d) < 1e-12) continue;
    const l1 = ((p[b + 1] - p[c + 1]) * (0 - p[c]) + (p[c] - p[b]) * (0 - p[c + 1])) / d;
    const l2 = ((p[c + 1] - p[a + 1]) * (0 - p[c]) + (p[a] - p[c]) * (0 - p[c + 1])) / d;
    const l3 = 1 - l1 - l2;
    if (l1 < 0 || l2 < 0 || l3 < 0) continue;
    const z = l1 * p[a + 2] + l2 * p[b + 2] + l3 * p[c + 2];
    if (z < 60 && z > best) best = z;
  }
  return best;
}

/** A closed cube of side `outer` (outward winding) with a concentric cavity of side `inner` (inward winding). */
function hollowCube(outer: number, inner: number): IndexedMesh {
  const corners = (size: number) => {
    const h = size / 2;
    const out: number[] = [];
    for (const z of [-h, h])
      for (const y of [-h, h]) for (const x of [-h, h]) out.push(x + outer / 2, y + outer / 2, z + outer / 2);
    return out;
  };
  // faces of a cube over corners 0..7 (x fastest), counter-clockwise seen from outside
  const faces = [
    0, 2, 1, 1, 2, 3, 4, 5, 6, 5, 7, 6, 0, 1, 4, 1, 5, 4, 2, 6, 3, 3, 6, 7, 0, 4, 2, 2, 4, 6, 1, 3, 5, 3, 7, 5,
  ];
  const indices = [...faces, ...faces.map((v, i) => (i % 3 === 1 ? faces[i + 1] : i % 3 === 2 ? faces[i - 1] : v) + 8)];
  return { positions: new Float32Array([...corners(outer), ...corners(inner)]), indices: new Uint32Array(indices) };
}
