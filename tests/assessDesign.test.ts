/**
 * The one design assessment: plate fit by grid arithmetic, parts fitted on their own, the outdoor wall from the
 * designed or the measured thickness, an unknown colour reported instead of thrown, and the three callers (editor
 * worker, mesh analysis, family jobs) giving the same production figures for the same design and sample budgets.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { assessDesign, measureDesign, type DesignChoice } from '../shared/assessment/assessDesign';
import { analyzeMesh } from '../shared/analysis/analyzeMesh';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import type { PrinterProfile } from '../shared/schemas/production';
import { computeDesignFigures } from '../src/workers/computeDesignFigures';
import { evaluateVariant } from '../server/jobs/evaluateVariant';
import { computeVariantGeometry, FAMILY_SUPPORT_RAYS, FAMILY_WALL_SAMPLES } from '../server/jobs/variantGeometry';
import { generate, type GenerateResult } from '../templates/generate';
import { box, geomToMesh } from './meshFixtures';

const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
const printer: PrinterProfile = { ...DEFAULT_PRINTERS[0], buildVolumeMm: { x: 230, y: 230, z: 250 } };
const choice: DesignChoice = {
  printer,
  material: pla,
  colourId: 'white',
  settings: DEFAULT_SETTINGS,
  rates: DEFAULT_RATES,
};

describe('assessDesign on simple solids', () => {
  it('fits a 40 mm cube 4 × 4 times on a 230 mm plate with 10 mm gaps', () => {
    const { measure } = measureDesign(geomToMesh(box([0, 0, 0], [40, 40, 40])));
    const { fit, production } = assessDesign(measure, choice);
    // source: grid packing n = floor((B + s) / (f + s)) = floor(240 / 50) = 4 per axis (arithmetic)
    expect(fit.fits).toBe(true);
    expect(fit.copiesPerPlate).toBe(16);
    expect(fit.heightMm).toBeCloseTo(40, 6);
    // source: cube volume 40³ = 64,000 mm³ (arithmetic)
    expect(measure.volumeMm3).toBeCloseTo(64_000, 3);
    expect(production.massG).toBeGreaterThan(0);
  });

  it('fits listed parts each on its own and prints to the tallest part', () => {
    const mesh = geomToMesh(box([0, 0, 0], [40, 40, 40]));
    const small = geomToMesh(box([60, 0, 0], [80, 20, 20]));
    const joined = {
      positions: new Float32Array([...mesh.positions, ...small.positions]),
      indices: new Uint32Array([...mesh.indices, ...Array.from(small.indices, (i) => i + mesh.positions.length / 3)]),
    };
    const { measure } = measureDesign(joined, { partTriangles: [mesh.indices.length / 3, small.indices.length / 3] });
    expect(measure.partSizesMm).toEqual([
      [40, 40, 40],
      [20, 20, 20],
    ]);
    const { fit } = assessDesign(measure, choice);
    expect(fit.parts).toHaveLength(2);
    expect(fit.heightMm).toBeCloseTo(40, 6);
    // A 240 mm tall part does not fit a 230 × 230 × 250 printer lying down but fits standing: 240 < 250.
    const tall = measureDesign(geomToMesh(box([0, 0, 0], [30, 30, 240]))).measure;
    expect(assessDesign(tall, choice).fit.fits).toBe(true);
    const tooTall = measureDesign(geomToMesh(box([0, 0, 0], [30, 30, 260]))).measure;
    expect(assessDesign(tooTall, choice).fit.fits).toBe(false);
  });

  it('takes the designed wall when given, else the measured one, and reports an unknown colour', () => {
    const { measure } = measureDesign(geomToMesh(box([0, 0, 0], [40, 40, 40])));
    const designed = assessDesign({ ...measure, thinnestWallMm: 3.2 }, choice, { wallThicknessMm: 4 });
    expect(designed.outdoor?.wallThicknessMm).toBe(4);
    expect(designed.outdoor?.wallThicknessFrom).toBe('options');
    const measured = assessDesign({ ...measure, thinnestWallMm: 3.2 }, choice);
    expect(measured.outdoor?.wallThicknessMm).toBe(3.2);
    expect(measured.outdoor?.wallThicknessFrom).toBe('measured');
    const unknown = assessDesign(measure, { ...choice, colourId: 'no-such-colour' });
    expect(unknown.outdoor).toBeNull();
    expect(unknown.outdoorProblem).toMatch(/no-such-colour/);
    expect(unknown.birdFit).toBeNull();
  });
});

describe('the three callers agree', () => {
  let design: GenerateResult;
  beforeAll(async () => {
    design = await generate('gable-box', {});
  }, 60_000);

  it('the editor figures equal the mesh analysis with the same sample budgets', () => {
    const white = pla.colours.find((c) => c.id === 'white')!;
    const editor = computeDesignFigures(design, {
      printer,
      material: pla,
      colour: white,
      settings: DEFAULT_SETTINGS,
      rates: DEFAULT_RATES,
    }).figures;
    const analysis = analyzeMesh(design.mesh, {
      printer,
      material: pla,
      colourId: 'white',
      wallThicknessMm: design.facts.wallThicknessMm,
      settings: DEFAULT_SETTINGS,
      rates: DEFAULT_RATES,
      partTriangles: design.partTriangles,
      geometry: { supportMaxRays: 60_000, wallSamples: 1_500 },
    }).report;
    expect(editor.production?.massG).toBeCloseTo(analysis.production.massG, 9);
    expect(editor.production?.printTimeMin).toBeCloseTo(analysis.production.printTimeMin, 9);
    expect(editor.production?.cost.totalCents).toBe(analysis.production.cost.totalCents);
    expect(editor.fitsPrinter).toBe(analysis.buildPlate.fits);
    expect(editor.outdoor?.roof.solAirC).toBeCloseTo(analysis.outdoor.roof.solAirC, 9);
  });

  it('a family variant equals the mesh analysis with the family budgets', async () => {
    const geometry = await computeVariantGeometry('gable-box', {});
    const variant = evaluateVariant(geometry, {
      printer,
      material: pla,
      supportBudgetMm3: 1e9,
      region: null,
      colourId: 'white',
      // the values the database is seeded with, passed as the jobs pass the studio's
      settings: DEFAULT_SETTINGS,
      rates: DEFAULT_RATES,
    });
    const analysis = analyzeMesh(design.mesh, {
      printer,
      material: pla,
      colourId: 'white',
      wallThicknessMm: design.facts.wallThicknessMm,
      settings: DEFAULT_SETTINGS,
      rates: DEFAULT_RATES,
      partTriangles: design.partTriangles,
      geometry: { supportMaxRays: FAMILY_SUPPORT_RAYS, wallSamples: FAMILY_WALL_SAMPLES },
    }).report;
    expect(variant.report.massG).toBeCloseTo(analysis.production.massG, 9);
    expect(variant.report.printTimeMin).toBeCloseTo(analysis.production.printTimeMin, 9);
    expect(variant.cost.costCents).toBe(analysis.production.cost.totalCents);
    expect(variant.report.copiesPerPlate).toBe(analysis.buildPlate.copiesPerPlate);
    expect(variant.report.outdoor?.wall.solAirC).toBeCloseTo(analysis.outdoor.wall.solAirC, 9);
  }, 60_000);
});
