import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { estimateProduction } from '../shared/production/estimateProduction';
import { estimateFarmCapacity } from '../shared/production/estimateFarmCapacity';
import { filamentAreaMm2, filamentLengthM } from '../shared/production/filament';
import { volumetricFlowMm3s } from '../shared/production/volumetricFlow';
import {
  CostRatesSchema,
  MaterialSchema,
  PrinterProfileSchema,
  PrintSettingsSchema,
  type ProductionInput,
} from '../shared/schemas/production';

const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
const petg = DEFAULT_MATERIALS.find((m) => m.id === 'petg')!;
const asa = DEFAULT_MATERIALS.find((m) => m.id === 'asa')!;
/** A 0.4 mm test printer with a V6-class hot end, independent of the demo farm's profiles. */
const printer = PrinterProfileSchema.parse({
  id: 'test-04',
  name: 'Test 0.4 mm',
  buildVolumeMm: { x: 200, y: 200, z: 200 },
  nozzleMm: 0.4,
  layerHeightMm: 0.2,
  lineWidthMm: 0.45,
  maxVolumetricFlowMm3s: 11, // source: Ellis' Print Tuning Guide, "Determining max volumetric flow rate": V6 class 11 mm³/s
  averagePowerW: 110,
  machineRateCentsPerHour: 50,
  filamentDiameterMm: 1.75,
});
/** Hand-checkable print settings: 3 perimeters, 4 top and bottom layers, 15 % infill at 100 mm/s. */
const SETTINGS = {
  ...DEFAULT_SETTINGS,
  perimeters: 3,
  infillPct: 15,
  printSpeedMmS: 100,
  topLayers: 4,
  bottomLayers: 4,
};

/** A 40 mm cube standing on the plate: volume, area and footprint are analytic. */
const cube40: ProductionInput = {
  volumeMm3: 40 ** 3,
  surfaceAreaMm2: 6 * 40 ** 2,
  heightMm: 40,
  supportVolumeMm3: 0,
  bboxSizeMm: [40, 40, 40],
  footprintMm2: 40 ** 2,
};

describe('filament', () => {
  it('gives the published cross-section of 1.75 mm filament', () => {
    // source: fabbaloo 2018 — 1.75 mm: A = 2.405 mm²
    expect(filamentAreaMm2(1.75)).toBeCloseTo(2.405, 3);
    // source: computed from ρ and the filament cross-section (fabbaloo, Basic 3D printer filament calculations, 2018) — 2.85 mm: A = 6.379 mm²
    expect(filamentAreaMm2(2.85)).toBeCloseTo(6.379, 3);
  });

  it('gives about 335 m per kg of 1.75 mm PLA at 1.24 g/cm³', () => {
    // source: ecoreprap.com — 1 kg PLA, 1.75 mm ≈ 335 m ([C] 335.3 m)
    expect(filamentLengthM(1000, 1.24, 1.75)).toBeCloseTo(335.3, 0);
    // source: ecoreprap.com — with ρ 1.25 ≈ 333 m
    expect(Math.abs(filamentLengthM(1000, 1.25, 1.75) - 333)).toBeLessThan(0.6);
  });

  it('matches the computed lengths per kg and masses per metre of PETG and ASA', () => {
    // source: computed from ρ and the filament cross-section (fabbaloo, Basic 3D printer filament calculations, 2018) — length per kg: PETG 327.4 m; ASA 388.6 m; ABS ≈ 400 m (ρ 1.04)
    expect(filamentLengthM(1000, petg.densityGcm3, 1.75)).toBeCloseTo(327.4, 0);
    expect(filamentLengthM(1000, asa.densityGcm3, 1.75)).toBeCloseTo(388.6, 0);
    expect(Math.abs(filamentLengthM(1000, 1.04, 1.75) - 400)).toBeLessThan(1);
    // source: computed from ρ and the filament cross-section (fabbaloo, Basic 3D printer filament calculations, 2018) — mass per metre: PLA 2.98 g/m, PETG 3.06 g/m, ASA 2.57 g/m
    expect(1 / filamentLengthM(1, pla.densityGcm3, 1.75)).toBeCloseTo(2.98, 2);
    expect(1 / filamentLengthM(1, petg.densityGcm3, 1.75)).toBeCloseTo(3.06, 1);
    expect(1 / filamentLengthM(1, asa.densityGcm3, 1.75)).toBeCloseTo(2.57, 2);
  });
});

describe('volumetric flow', () => {
  it('is layer height × line width × speed', () => {
    // source: muppetlabs "Calibrating maximum volumetric rate" — 0.2 × 0.45 × 100 = 9 mm³/s
    expect(volumetricFlowMm3s(0.2, 0.45, 100)).toBeCloseTo(9, 9);
  });
});

describe('default data', () => {
  it('parses with the schemas and carries the published material values', () => {
    for (const p of DEFAULT_PRINTERS) expect(() => PrinterProfileSchema.parse(p)).not.toThrow();
    for (const m of DEFAULT_MATERIALS) expect(() => MaterialSchema.parse(m)).not.toThrow();
    expect(() => PrintSettingsSchema.parse(DEFAULT_SETTINGS)).not.toThrow();
    expect(() => CostRatesSchema.parse(DEFAULT_RATES)).not.toThrow();
    // source: NatureWorks Ingeo 4043D TDS — PLA 1.24 g/cm³; Ingeo 2003D HDT 55 °C at 0.45 MPa
    expect(pla.densityGcm3).toBe(1.24);
    expect(pla.heatDeflectionC).toBeGreaterThanOrEqual(55);
    expect(pla.heatDeflectionC).toBeLessThanOrEqual(58);
    // source: renato.design — ASA 1.07 g/cm³
    expect(asa.densityGcm3).toBe(1.07);
    // source: solar absorptance table, scirp.org paper 88555 — white paint α ≈ 0.25 (white enamel 0.252), black ≈ 0.95 (soot 0.95)
    expect(pla.colours.find((c) => c.id === 'white')!.solarAbsorptance).toBeCloseTo(0.25, 2);
    expect(pla.colours.find((c) => c.id === 'black')!.solarAbsorptance).toBeCloseTo(0.95, 2);
  });

  it('has farm profiles of its own: invented build volumes, 0.6 and 0.8 mm nozzles within the rules of thumb', () => {
    // from memory: common desktop farm build volumes are about 220×220×250, 250×210×210 and 256×256×256 mm; the
    // demo profiles must not copy a machine on sale, so none may be within 2 mm of those on every axis
    const common = [
      [220, 220, 250],
      [250, 210, 210],
      [256, 256, 256],
    ];
    for (const p of DEFAULT_PRINTERS) {
      const size = [p.buildVolumeMm.x, p.buildVolumeMm.y, p.buildVolumeMm.z];
      for (const c of common)
        expect(
          size.every((v, i) => Math.abs(v - c[i]!) <= 2),
          p.id,
        ).toBe(false);
      // source: 3D Printerly, "3D printing line width": slicers default to 100–120 % of the nozzle diameter
      expect(p.lineWidthMm / p.nozzleMm, p.id).toBeGreaterThanOrEqual(1);
      expect(p.lineWidthMm / p.nozzleMm, p.id).toBeLessThanOrEqual(1.2);
      // source: Inov3D: the extrusion width should be at least 1.2 × the layer height
      expect(p.lineWidthMm, p.id).toBeGreaterThanOrEqual(1.2 * (p.maxLayerHeightMm ?? p.layerHeightMm) - 1e-9);
      // common practice, no source: layers at most 75–80 % of the nozzle
      expect(p.maxLayerHeightMm ?? p.layerHeightMm, p.id).toBeLessThanOrEqual(0.8 * p.nozzleMm + 1e-9);
      expect(p.layerHeightMm).toBeGreaterThanOrEqual(p.minLayerHeightMm ?? 0);
      expect(p.layerHeightMm).toBeLessThanOrEqual(p.maxLayerHeightMm ?? Infinity);
      // source: Ellis' Print Tuning Guide, "Determining max volumetric flow rate": 11–30 mm³/s across hot-end classes
      expect(p.maxVolumetricFlowMm3s).toBeGreaterThanOrEqual(11);
      expect(p.maxVolumetricFlowMm3s).toBeLessThanOrEqual(30);
      expect(p.sourceNote, p.id).toBeTruthy();
    }
    expect(DEFAULT_PRINTERS.map((p) => p.nozzleMm)).toEqual(expect.arrayContaining([0.6, 0.8]));
  });

  it('charges the post-processing of each finish: coating and packing at the labour rate, plus consumables', () => {
    // hand computation: UV clear coat (6 + 3) min × 25 €/h = 375 cents + 45 cents consumables = 420 cents;
    // bare: 3 min packing × 25 €/h = 125 cents
    const coat = estimateProduction(cube40, printer, pla, DEFAULT_SETTINGS, DEFAULT_RATES, 'uv-clear-coat');
    const bare = estimateProduction(cube40, printer, pla, DEFAULT_SETTINGS, DEFAULT_RATES, 'none');
    expect(coat.cost.postProcessingCents).toBe(420);
    expect(bare.cost.postProcessingCents).toBe(125);
    expect(coat.cost.totalCents - bare.cost.totalCents).toBe(295);
    // no finish named: the first (bare) one
    expect(estimateProduction(cube40, printer, pla, DEFAULT_SETTINGS, DEFAULT_RATES).cost).toEqual(bare.cost);
    const unknown = estimateProduction(cube40, printer, pla, DEFAULT_SETTINGS, DEFAULT_RATES, 'gold-leaf');
    expect(unknown.cost.postProcessingCents).toBe(0);
    expect(unknown.notes.join(' ')).toMatch(/"gold-leaf" is not in the cost rates/);
  });
});

describe('estimateProduction', () => {
  it('weighs a solid part as density × volume at 100 % infill', () => {
    // analytic: a fully dense part has mass ρ·V, whatever the shell split
    const solid = { ...SETTINGS, infillPct: 100 };
    const e = estimateProduction(cube40, printer, pla, solid, DEFAULT_RATES);
    expect(e.extrudedVolumeMm3).toBeCloseTo(64000, 6);
    expect(e.massG).toBeCloseTo(64 * 1.24, 6);
    // source: L = m/(ρ·A), fabbaloo, Basic 3D printer filament calculations, 2018 — 64 cm³ / 2.405 mm² = 26.61 m
    expect(e.filamentLengthM).toBeCloseTo(64000 / 2.405 / 1000, 1);
  });

  it('computes the shell from area × perimeters × line width and skins from layers (hand-computed)', () => {
    // hand computation of the documented model: sides 4 × 1600 mm² × 3 × 0.45 mm = 8640 mm³;
    // top and bottom 1600 mm² × 4 × 0.2 mm = 1280 mm³ each; infill (64000 − 11200) × 15 % = 7920 mm³
    const e = estimateProduction(cube40, printer, pla, SETTINGS, DEFAULT_RATES);
    expect(e.shellVolumeMm3).toBeCloseTo(11200, 6);
    expect(e.infillVolumeMm3).toBeCloseTo(7920, 6);
    expect(e.extrudedVolumeMm3).toBeCloseTo(19120, 6);
    expect(e.massG).toBeCloseTo(19.12 * 1.24, 6);
    expect(e.layers).toBe(200);
  });

  it('caps the shell at the part volume for thin parts', () => {
    // analytic: a 1 mm plate 100 × 100 mm cannot hold more plastic than its volume
    const plate: ProductionInput = {
      volumeMm3: 10000,
      surfaceAreaMm2: 2 * 10000 + 4 * 100,
      heightMm: 1,
      supportVolumeMm3: 0,
      bboxSizeMm: [100, 100, 1],
      footprintMm2: 10000,
    };
    const e = estimateProduction(plate, printer, pla, SETTINGS, DEFAULT_RATES);
    expect(e.shellVolumeMm3).toBeCloseTo(10000, 6);
    expect(e.infillVolumeMm3).toBeCloseTo(0, 9);
  });

  it('reduces print time to V / Q without overheads (the lower bound)', () => {
    // source: computed from ρ and the filament cross-section (fabbaloo, Basic 3D printer filament calculations, 2018) — t_min ≈ V_extruded / Q_eff; Q = 0.2 × 0.45 × 100 = 9 mm³/s
    const bare = { ...PrinterProfileSchema.parse(printer), layerChangeS: 0 };
    const settings = { ...SETTINGS, infillPct: 100, flowEfficiency: 1, travelOverheadPct: 0 };
    const e = estimateProduction(cube40, bare, pla, settings, DEFAULT_RATES);
    expect(e.effectiveFlowMm3s).toBeCloseTo(9, 9);
    expect(e.printTimeMin).toBeCloseTo(64000 / 9 / 60, 6);
  });

  it('caps the flow at the printer maximum', () => {
    // source: Ellis' Print Tuning Guide — a V6-class hot end melts about 11 mm³/s
    const fast = { ...SETTINGS, printSpeedMmS: 300, flowEfficiency: 1 };
    const e = estimateProduction(cube40, printer, pla, fast, DEFAULT_RATES);
    expect(printer.maxVolumetricFlowMm3s).toBe(11);
    expect(e.effectiveFlowMm3s).toBeCloseTo(11, 9);
  });

  it('takes energy as average power × time', () => {
    // source: 3dprintscape — 189.5 W average over a 1 h print = 0.1895 kWh
    const p = { ...PrinterProfileSchema.parse(printer), averagePowerW: 189.5, layerChangeS: 0 };
    const oneHourMm3 = 9 * 3600; // at exactly 9 mm³/s
    const part: ProductionInput = { ...cube40, volumeMm3: oneHourMm3, surfaceAreaMm2: 0, footprintMm2: 0 };
    const settings = { ...SETTINGS, infillPct: 100, flowEfficiency: 1, travelOverheadPct: 0 };
    const e = estimateProduction(part, p, pla, settings, DEFAULT_RATES);
    expect(e.printTimeMin).toBeCloseTo(60, 6);
    expect(e.energyKwh).toBeCloseTo(0.1895, 6);
  });

  it('has a cost breakdown that adds up and a price with the stated margin', () => {
    const part = { ...cube40, supportVolumeMm3: 5000 };
    const e = estimateProduction(part, printer, pla, { ...SETTINGS, supportInfillPct: 15 }, DEFAULT_RATES);
    const { totalCents, ...parts } = e.cost;
    // analytic: the total is the sum of its parts, in whole cents
    expect(Object.values(parts).reduce((a, b) => a + b, 0)).toBe(totalCents);
    for (const v of Object.values(e.cost)) expect(Number.isInteger(v)).toBe(true);
    // hand computation of the documented model, from the inputs alone: extruded volume = 11,200 mm³ shell + 7,920 mm³
    // infill (as in the shell test above) + 5,000 mm³ support × 15 % = 19,870 mm³; mass 19.87 cm³ × 1.24 g/cm³ =
    // 24.639 g; material 24.639 g × 2,500 cents/kg = 61.6 → 62 cents. Support labour = 5 cm³ × 1 min/cm³ × 25 €/h.
    expect([pla.densityGcm3, pla.priceCentsPerKg]).toEqual([1.24, 2500]);
    expect(e.massG).toBeCloseTo(24.6388, 4);
    expect(e.cost.materialCents).toBe(62);
    expect(e.cost.supportLabourCents).toBe(Math.round((5 * 1 * 2500) / 60));
    expect(e.cost.packagingCents).toBe(DEFAULT_RATES.packagingCents);
    // margin definition: price = cost / (1 − margin), so (price − cost) / price ≈ 40 %
    expect((e.suggestedPriceCents - totalCents) / e.suggestedPriceCents).toBeCloseTo(0.4, 2);
    expect(e.notes.join(' ')).toMatch(/slicer estimate/);
  });

  it('spreads the failed prints over the good ones', () => {
    // analytic: with failure share f, each good unit carries f / (1 − f) extra material, machine time and energy
    const rates = { ...DEFAULT_RATES, failureAllowancePct: 20 };
    const e = estimateProduction({ ...cube40, volumeMm3: 400000 }, printer, pla, SETTINGS, rates);
    const direct = e.cost.materialCents + e.cost.machineTimeCents + e.cost.energyCents;
    expect(Math.abs(e.cost.failureAllowanceCents - direct * 0.25)).toBeLessThanOrEqual(1);
  });

  it('grows mass, time and cost with infill and with support (property)', () => {
    // common practice, no source: more plastic never costs less
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 99, noNaN: true }),
        fc.double({ min: 0.5, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 50000, noNaN: true }),
        (infillPct, stepPct, supportMm3) => {
          const part = { ...cube40, supportVolumeMm3: supportMm3 };
          const lo = estimateProduction(part, printer, pla, { ...SETTINGS, infillPct }, DEFAULT_RATES);
          const hi = estimateProduction(
            { ...part, supportVolumeMm3: supportMm3 + 1000 },
            printer,
            pla,
            { ...SETTINGS, infillPct: Math.min(100, infillPct + stepPct) },
            DEFAULT_RATES,
          );
          expect(hi.massG).toBeGreaterThan(lo.massG);
          expect(hi.printTimeMin).toBeGreaterThan(lo.printTimeMin);
          expect(hi.cost.totalCents).toBeGreaterThanOrEqual(lo.cost.totalCents);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('rejects impossible input with a clear reason', () => {
    expect(() => estimateProduction({ ...cube40, volumeMm3: -1 }, printer, pla, SETTINGS, DEFAULT_RATES)).toThrow(
      /volumeMm3/,
    );
  });
});

describe('estimateFarmCapacity', () => {
  it('counts plates, days and lead time', () => {
    // hand computation: 100 units / 4 per plate = 25 plates; 7 per printer on 4 printers;
    // 7 × (4 × 120 + 10) min = 3430 min = 2.38 days at 24 h; lead time 3 + 1 handling day
    const c = estimateFarmCapacity({
      unitsWanted: 100,
      printers: 4,
      hoursPerDay: 24,
      copiesPerPlate: 4,
      printTimeMin: 120,
      failureRatePct: 0,
    });
    expect(c.plates).toBe(25);
    expect(c.platesPerPrinter).toBe(7);
    expect(c.plateTimeMin).toBe(490);
    expect(c.printDays).toBeCloseTo(3430 / 1440, 9);
    expect(c.leadTimeDays).toBe(4);
  });

  it('adds plates for the failure rate', () => {
    // hand computation: 100 / (4 × 0.8) = 31.25 -> 32 plates, 102.4 expected good units
    const c = estimateFarmCapacity({
      unitsWanted: 100,
      printers: 4,
      hoursPerDay: 8,
      copiesPerPlate: 4,
      printTimeMin: 120,
      failureRatePct: 20,
    });
    expect(c.plates).toBe(32);
    expect(c.expectedGoodUnits).toBeGreaterThanOrEqual(100);
    expect(c.printDays).toBeCloseTo((8 * 490) / 480, 9);
  });
});
