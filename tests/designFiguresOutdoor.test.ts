/**
 * The editor's figures use the chosen printer, material and colour objects: mass follows the material's density,
 * and the outdoor section follows the colour (a dark PLA roof in full sun passes PLA's heat-deflection temperature,
 * a white one stays below it). Checked against the sol-air formula and the published values named beside each check.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import type { Material } from '../shared/schemas/production';
import { computeDesignFigures } from '../src/workers/computeDesignFigures';
import type { ProductionChoice } from '../src/workers/geometryProtocol';
import { generate, type GenerateResult } from '../templates/generate';

const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
const petg = DEFAULT_MATERIALS.find((m) => m.id === 'petg')!;

function choice(material: Material, colourId: string): ProductionChoice {
  return {
    printer: DEFAULT_PRINTERS.find((p) => p.id === 'rowan-farm-06')!,
    material,
    colour: material.colours.find((c) => c.id === colourId)!,
    settings: DEFAULT_SETTINGS,
    rates: DEFAULT_RATES,
  };
}

let design: GenerateResult;
beforeAll(async () => {
  design = await generate('gable-box', {});
}, 60_000);

describe('design figures in the chosen material and colour', () => {
  it('black PLA fails the roof check, white PLA passes', () => {
    const black = computeDesignFigures(design, choice(pla, 'black')).figures.outdoor!;
    const white = computeDesignFigures(design, choice(pla, 'white')).figures.outdoor!;
    // source: sol-air T = To + a*I/ho - dR (ASHRAE): 30 + 0.95*1000/17 - 3.9 ≈ 82.0 °C
    expect(black.roof.solAirC).toBeCloseTo(30 + (0.95 * 1000) / 17 - 3.9, 1);
    // source: Ingeo 2003D HDT 55 °C at 0.45 MPa — a black roof is above it
    expect(black.roof.verdict).toBe('fail');
    expect(black.verdict).toBe('fail');
    expect(black.cautions.join(' ')).toMatch(/heat-deflection/);
    // source: white enamel absorptance 0.252: 30 + 0.25*1000/17 - 3.9 ≈ 40.8 °C, 14 K below 55
    expect(white.roof.solAirC).toBeCloseTo(30 + (0.25 * 1000) / 17 - 3.9, 1);
    expect(white.verdict).toBe('ok');
  });

  it('compares the design wall with a 19 mm pine board', () => {
    const outdoor = computeDesignFigures(design, choice(pla, 'white')).figures.outdoor!;
    const wall = outdoor.wallResistance!;
    // source: USDA Wood Handbook pine k 0.11 W/m·K: 0.019 / 0.11 ≈ 0.173 m²K/W
    expect(wall.pineBoardRM2KW).toBeCloseTo(0.019 / 0.11, 3);
    // The printed wall is the template's wall thickness: skin + core add up to it.
    expect(wall.skinThicknessMm + wall.coreThicknessMm).toBeCloseTo(design.facts.wallThicknessMm, 6);
    expect(wall.rM2KW).toBeGreaterThan(0);
    expect(wall.ratioToPine).toBeCloseTo(wall.rM2KW / wall.pineBoardRM2KW, 6);
  });

  it('mass follows the chosen material density', () => {
    const massPla = computeDesignFigures(design, choice(pla, 'white')).figures.production!.massG;
    const massPetg = computeDesignFigures(design, choice(petg, 'white')).figures.production!.massG;
    // source: densities PLA 1.24, PETG 1.27 g/cm³ — same extruded volume, mass scales
    expect(massPetg / massPla).toBeCloseTo(1.27 / 1.24, 3);
  });
});
