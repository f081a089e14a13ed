import { describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS } from '../shared/production/defaults';
import { assessOutdoor } from '../shared/thermal/assessOutdoor';
import { solAirTemperature } from '../shared/thermal/solAirTemperature';
import { wallResistance } from '../shared/thermal/wallResistance';

const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
const asa = DEFAULT_MATERIALS.find((m) => m.id === 'asa')!;

describe('solAirTemperature', () => {
  // source: worked values [C] from ASHRAE Handbook—Fundamentals, T_sa = T_o + α·I/h_o − ε·ΔR/h_o;
  // h_o = 17, T_o = 30 °C; wall I = 600 W/m², ΔR term 0; roof I = 1000 W/m², −3.9 K
  const cases = [
    { surface: 'wall', a: 0.25, expected: 38.8 },
    { surface: 'wall', a: 0.95, expected: 63.5 },
    { surface: 'roof', a: 0.25, expected: 40.8 },
    { surface: 'roof', a: 0.6, expected: 61.4 },
    { surface: 'roof', a: 0.95, expected: 82.0 },
  ];
  for (const c of cases) {
    it(`${c.surface}, α ${c.a} -> ${c.expected} °C`, () => {
      const roof = c.surface === 'roof';
      const t = solAirTemperature({
        airC: 30,
        irradianceWm2: roof ? 1000 : 600,
        absorptance: c.a,
        hoC: 17,
        longwaveCorrectionK: roof ? 3.9 : 0,
      });
      expect(Math.abs(t - c.expected)).toBeLessThan(0.06);
    });
  }

  it('matches the ASHRAE α/h_o ratios for light and dark surfaces', () => {
    // source: ASHRAE — α/h_o 0.026 (light, α ≈ 0.45) and 0.052 (dark, α ≈ 0.9) m²K/W
    const rise = (a: number) =>
      solAirTemperature({ airC: 0, irradianceWm2: 1, absorptance: a, hoC: 17, longwaveCorrectionK: 0 });
    // the published ratios are rounded ("α ≈ 0.45", "α ≈ 0.9"): compare within 3 %
    expect(Math.abs(rise(0.45) - 0.026) / 0.026).toBeLessThan(0.03);
    expect(Math.abs(rise(0.9) - 0.052) / 0.052).toBeLessThan(0.03);
  });
});

describe('wallResistance', () => {
  it('gives about 0.018 m²K/W for a 2.4 mm solid PLA wall', () => {
    // source: computed from k (USDA FPL Wood Handbook Table 4-7; MakeItFrom PLA data sheet) — a 2.4 mm solid PLA wall ≈ 0.018 (k 0.13, MakeItFrom)
    const r = wallResistance({ wallThicknessMm: 2.4, perimeters: 3, lineWidthMm: 0.45, infillPct: 15, polymerK: 0.13 });
    expect(r.coreThicknessMm).toBe(0);
    expect(Math.abs(r.rM2KW - 0.018)).toBeLessThan(0.001);
    expect(r.limits.join(' ')).toMatch(/no enclosed air cells/);
  });

  it('compares with a 19 mm pine board of about 0.17 m²K/W', () => {
    // source: computed from k (USDA FPL Wood Handbook Table 4-7; MakeItFrom PLA data sheet) — ¾ in (19 mm) pine ≈ 0.17 m²K/W (k 0.11, USDA Wood Handbook)
    const r = wallResistance({ wallThicknessMm: 2.4, perimeters: 3, lineWidthMm: 0.45, infillPct: 15, polymerK: 0.13 });
    expect(Math.abs(r.pineBoardRM2KW - 0.17)).toBeLessThan(0.005);
    expect(r.ratioToPine).toBeLessThan(0.15);
  });

  it('puts the parallel-path core near a measured printed cellular panel', () => {
    // source: Anwajler et al., Materials 17(24):6293 (2024) — 0.038 W/m·K at 90 % porosity
    const wall = { wallThicknessMm: 20.9, perimeters: 1, lineWidthMm: 0.45, infillPct: 10, polymerK: 0.13 };
    const r = wallResistance(wall);
    const skinR = r.skinThicknessMm / 1000 / wall.polymerK;
    const coreK = r.coreThicknessMm / 1000 / (r.rM2KW - skinR);
    expect(Math.abs(coreK - 0.038) / 0.038).toBeLessThan(0.1);
  });

  it('keeps the series value above the parallel one and warns about large cells', () => {
    // analytic: the series (Reuss) bound on resistance is never below the parallel (Voigt) one
    const r = wallResistance({ wallThicknessMm: 12, perimeters: 2, lineWidthMm: 0.45, infillPct: 10, polymerK: 0.13 });
    expect(r.rUpperM2KW).toBeGreaterThan(r.rM2KW);
    // source: Grabowska & Kasperski 2020 — cells above ~6 mm let air move
    expect(r.infillCellSizeMm).toBeCloseTo(9, 6);
    expect(r.limits.join(' ')).toMatch(/convection/);
  });

  it('insulates better with thicker walls and with more air in the core', () => {
    // analytic: R grows with thickness; air (0.026) conducts less than PLA (0.13)
    const base = { wallThicknessMm: 10, perimeters: 2, lineWidthMm: 0.45, infillPct: 20, polymerK: 0.13 };
    expect(wallResistance({ ...base, wallThicknessMm: 15 }).rM2KW).toBeGreaterThan(wallResistance(base).rM2KW);
    expect(wallResistance({ ...base, infillPct: 10 }).rM2KW).toBeGreaterThan(wallResistance(base).rM2KW);
  });
});

describe('assessOutdoor', () => {
  it('fails a black PLA roof in full sun and says so', () => {
    // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) — black roof 82.0 °C vs PLA HDT 55 °C (NatureWorks Ingeo 2003D data sheet): "a dark PLA roof can exceed it"
    const a = assessOutdoor({ material: pla, colourId: 'black' });
    expect(a.roof.solAirC).toBeCloseTo(82.0, 1);
    expect(a.roof.verdict).toBe('fail');
    expect(a.roof.marginK).toBeLessThan(0);
    expect(a.verdict).toBe('fail');
    expect(a.cautions.join(' ')).toMatch(/heat-deflection/);
    expect(a.cautions.join(' ')).toMatch(/local rules/);
  });

  it('passes white PLA with the worked values and still shows the heat cautions', () => {
    // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) — white roof 40.8 °C, white wall 38.8 °C; PLA HDT 55 °C (Ingeo 2003D)
    const a = assessOutdoor({ material: pla, colourId: 'white' });
    expect(a.roof.solAirC).toBeCloseTo(40.8, 1);
    expect(a.wall.solAirC).toBeCloseTo(38.8, 1);
    expect(a.verdict).toBe('ok');
    // source: Audubon 2024 — > 41.7 °C is lethal to nestlings
    expect(a.cautions.join(' ')).toMatch(/41\.7/);
  });

  it('cautions when a surface comes within the margin of the HDT', () => {
    // ASHRAE sol-air formula: sand α 0.40 roof = 30 + 400/17 − 3.9 = 49.6 °C, 5.4 K under 55 °C
    const a = assessOutdoor({ material: pla, colourId: 'sand' });
    expect(a.roof.solAirC).toBeCloseTo(49.63, 1);
    expect(a.roof.verdict).toBe('caution');
  });

  it('keeps a dark ASA roof below its HDT', () => {
    // source: renato.design — ASA HDT 90–100 °C; roof 82.0 °C for α 0.95 (ASHRAE sol-air formula)
    const a = assessOutdoor({ material: asa, colourId: 'black' });
    expect(a.roof.verdict).toBe('caution');
    expect(a.roof.marginK).toBeGreaterThan(0);
  });

  it('adds the wall resistance beside pine when the wall is given', () => {
    const a = assessOutdoor({
      material: pla,
      colourId: 'white',
      wall: { wallThicknessMm: 3, perimeters: 3, lineWidthMm: 0.45, infillPct: 15 },
    });
    expect(a.wallResistance?.rM2KW).toBeGreaterThan(0);
    expect(a.cautions.join(' ')).toMatch(/19 mm pine/);
  });

  it('rejects an unknown colour', () => {
    expect(() => assessOutdoor({ material: pla, colourId: 'tartan' })).toThrow(/colourId/);
  });
});
