/**
 * The outdoor section of the print-readiness report: sol-air roof and wall temperatures for the chosen material and
 * colour, checked against the worked values of the ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals), and the wall thickness the
 * insulation estimate uses (given, or the measured thinnest wall). Also through the CLI with --colour.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyzeMesh, type AnalyzeMeshOptions } from '../shared/analysis/analyzeMesh';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { AnalysisReportSchema } from '../shared/schemas/analysis';
import type { IndexedMesh } from '../shared/schemas/mesh';
import type { Material } from '../shared/schemas/production';
import { box, geomToMesh, loadManifold, manifoldToMesh, toBinaryStl } from './meshFixtures';
import { useTestApp } from './setup/testApp';

const run = promisify(execFile);
const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
const base: AnalyzeMeshOptions = {
  printer: DEFAULT_PRINTERS[0]!,
  material: pla,
  settings: DEFAULT_SETTINGS,
  rates: DEFAULT_RATES,
};

let hollow: IndexedMesh;
const t = useTestApp();
beforeAll(async () => {
  const { Manifold } = await loadManifold();
  hollow = manifoldToMesh(Manifold.cube([60, 60, 60], true).subtract(Manifold.cube([54, 54, 54], true)));
});

describe('outdoor section of the analysis report', () => {
  it('gives the sol-air worked values for white and black PLA and flags black above the heat-deflection temperature', () => {
    const white = AnalysisReportSchema.parse(analyzeMesh(hollow, { ...base, colourId: 'white' }).report);
    const black = AnalysisReportSchema.parse(analyzeMesh(hollow, { ...base, colourId: 'black' }).report);
    // source: ASHRAE sol-air worked values — h_o 17, air 30 °C, wall 600 W/m², roof 1000 W/m²
    // with −3.9 K: α 0.25 wall 38.8 °C, roof 40.8 °C; α 0.95 wall 63.5 °C, roof 82.0 °C
    expect(white.outdoor.wall.solAirC).toBeCloseTo(38.8, 1);
    expect(white.outdoor.roof.solAirC).toBeCloseTo(40.8, 1);
    expect(black.outdoor.wall.solAirC).toBeCloseTo(63.5, 1);
    expect(black.outdoor.roof.solAirC).toBeCloseTo(82.0, 1);
    // source: PLA heat-deflection temperature at 0.45 MPa, 55 °C (Ingeo 2003D)
    expect(black.outdoor.heatDeflectionC).toBe(55);
    expect(black.outdoor.verdict).toBe('fail');
    expect(white.outdoor.verdict).toBe('ok');
    expect(
      black.warnings.some((w) => /heat-deflection temperature of 55 °C \(roof about 82 °C, wall about 64 °C\)/.test(w)),
    ).toBe(true);
    expect(white.warnings.some((w) => /heat-deflection/.test(w))).toBe(false);
    // The caution defers to local rules and expert practice.
    expect(black.outdoor.cautions.join(' ')).toMatch(/local rules/);
  });

  it('uses the roof value of a mid colour (α 0.60) from the worked table', () => {
    const grey: Material = { ...pla, colours: [{ id: 'grey', name: 'Grey', hex: '#808080', solarAbsorptance: 0.6 }] };
    const report = analyzeMesh(hollow, { ...base, material: grey }).report;
    // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) — roof, α 0.60: 61.4 °C (default colour is the material's first)
    expect(report.outdoor.colourId).toBe('grey');
    expect(report.outdoor.roof.solAirC).toBeCloseTo(61.4, 1);
  });

  it('takes the wall thickness from the options when known, else the measured thinnest wall', () => {
    const measured = analyzeMesh(hollow, { ...base, colourId: 'white' }).report.outdoor;
    // analytic: the hollow box has 3 mm walls (60 mm outside, 54 mm inside)
    expect(measured.wallThicknessFrom).toBe('measured');
    expect(measured.wallThicknessMm).toBeCloseTo(3, 2);
    expect(measured.wallResistance).toBeDefined();

    const given = analyzeMesh(hollow, { ...base, colourId: 'white', wallThicknessMm: 2.4 }).report.outdoor;
    expect(given.wallThicknessFrom).toBe('options');
    expect(given.wallThicknessMm).toBe(2.4);
    // source: USDA FPL Wood Handbook Table 4-7; MakeItFrom PLA data sheet — a 2.4 mm solid PLA wall ≈ 0.018 m²K/W; ¾ in pine ≈ 0.17 (3 loops × 2 faces × 0.45 mm
    // lines cover the whole 2.4 mm, so the wall is solid)
    expect(given.wallResistance!.rM2KW).toBeCloseTo(0.018, 3);
    expect(given.wallResistance!.pineBoardRM2KW).toBeCloseTo(0.17, 2);
  });

  it('is printed by the CLI with --colour, in °C and °F, and refuses an unknown colour', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'nw-outdoor-'));
    try {
      const file = join(dir, 'block.stl');
      await writeFile(file, toBinaryStl(geomToMesh(box([0, 0, 0], [40, 30, 10]))));
      const cli = ['tsx', 'server/cli/index.ts', 'analyze', '--in', file];
      const table = await run('npx', [...cli, '--colour', 'black']);
      // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) — black roof 82.0 °C, wall 63.5 °C; °F = °C × 9/5 + 32 (180 °F, 146 °F)
      expect(table.stdout).toMatch(/Roof in full sun\s+82\.0 °C \(180 °F\), above the limit/);
      expect(table.stdout).toMatch(/Wall in full sun\s+63\.5 °C \(146 °F\), above the limit/);
      expect(table.stdout).toMatch(/Heat deflection\s+55\.0 °C \(131 °F\)/);
      expect(table.stdout).toMatch(/Follow local rules/);
      const json = await run('npx', [...cli, '--colour', 'white', '--json']);
      const report = AnalysisReportSchema.parse(JSON.parse(json.stdout));
      expect(report.outdoor.roof.solAirC).toBeCloseTo(40.8, 1); // ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals), α 0.25
      const bad = await run('npx', [...cli, '--colour', 'tartan']).catch(
        (err: { code: number; stderr: string }) => err,
      );
      expect(bad).toMatchObject({ code: 2 });
      expect((bad as { stderr: string }).stderr).toMatch(/Unknown colour/);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  }, 60_000);
});

describe('POST /api/analyses with colourId', () => {
  it('returns the outdoor section for the colour and answers 400 naming colourId for an unknown one', async () => {
    const designer = await t.agent('designer');
    const stl = Buffer.from(toBinaryStl(geomToMesh(box([0, 0, 0], [20, 20, 20]))));
    const res = await designer
      .post('/api/analyses')
      .field('materialId', 'pla')
      .field('colourId', 'black')
      .attach('file', stl, 'cube.stl');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const report = AnalysisReportSchema.parse(res.body);
    expect(report.outdoor.colourId).toBe('black');
    expect(report.outdoor.roof.solAirC).toBeCloseTo(82.0, 1); // ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals), α 0.95 roof
    const bad = await designer.post('/api/analyses').field('colourId', 'tartan').attach('file', stl, 'cube.stl');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^colourId: /);
  });
});
