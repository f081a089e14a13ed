import type { CostRates, Material, PrinterProfile, PrintSettings } from '../schemas/production';

// Values marked [P], [M] or [C] follow ../../../shared/reference/trade-facts.md (published / from memory / computed).
// The printers, rates and prices are an invented farm for the demo studio; change them per studio.

/**
 * Generic farm printers (invented names). Build volumes are typical desktop farm sizes (trade-facts §3, [M]);
 * maximum flows follow published hot-end classes for a 0.4 mm brass nozzle (Ellis' Print Tuning Guide via
 * trade-facts §4 [P]: V6-class 11 mm³/s, high-flow 24 mm³/s).
 */
export const DEFAULT_PRINTERS: PrinterProfile[] = [
  {
    id: 'workhorse-220',
    name: 'Workhorse 220',
    buildVolumeMm: { x: 220, y: 220, z: 250 },
    nozzleMm: 0.4,
    layerHeightMm: 0.2, // 0.2 mm standard at a 0.4 mm nozzle (trade-facts §3 [M])
    lineWidthMm: 0.45, // 0.45 mm at 0.4 mm nozzle, a common default (trade-facts §3 [M])
    maxVolumetricFlowMm3s: 11, // V6-class hot end (Ellis [P])
    averagePowerW: 110, // i3-class printers average ~60–120 W with PLA (trade-facts §4 [M])
    machineRateCentsPerHour: 50, // desktop FDM $0.5–2/h (trade-facts §4 [M])
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5, // assumption, no source
    plateWarmUpMin: 6, // assumption, no source
  },
  {
    id: 'cube-256',
    name: 'Cube 256',
    buildVolumeMm: { x: 256, y: 256, z: 256 },
    nozzleMm: 0.4,
    layerHeightMm: 0.2,
    lineWidthMm: 0.45,
    maxVolumetricFlowMm3s: 24, // high-flow hot end class (Ellis [P])
    averagePowerW: 190, // measured average 189.5 W over a 1 h PLA print (3dprintscape via trade-facts §4 [P])
    machineRateCentsPerHour: 90, // assumption within $0.5–2/h (trade-facts §4 [M])
    filamentDiameterMm: 1.75,
    layerChangeS: 1,
    plateWarmUpMin: 5,
  },
  {
    id: 'longbed-250',
    name: 'Longbed 250',
    buildVolumeMm: { x: 250, y: 210, z: 210 },
    nozzleMm: 0.4,
    layerHeightMm: 0.2,
    lineWidthMm: 0.45,
    maxVolumetricFlowMm3s: 15, // mid-flow hot end class (Ellis [P]: 13–15 mm³/s)
    averagePowerW: 130,
    machineRateCentsPerHour: 70,
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5,
    plateWarmUpMin: 6,
  },
];

// Solar absorptance per colour (trade-facts §2d). Filament colours are not paints: these are colour-class
// estimates anchored on the published paint values, to be measured for each filament where it matters.
const WHITE = { id: 'white', name: 'White', hex: '#f4f2ec', solarAbsorptance: 0.25 }; // white enamel 0.252 [P]
const SAND = { id: 'sand', name: 'Sand', hex: '#d8c8a4', solarAbsorptance: 0.4 }; // between light cream 0.30 and light green 0.50 [P]; estimate
const MOSS = { id: 'moss-green', name: 'Moss green', hex: '#5f6f3a', solarAbsorptance: 0.65 }; // darker than light green 0.50 [P]; medium class 0.475–0.70; estimate
const BARK = { id: 'bark-brown', name: 'Bark brown', hex: '#5a4030', solarAbsorptance: 0.8 }; // dark class > 0.70 [P]; estimate
const BLACK = { id: 'black', name: 'Black', hex: '#1c1c1c', solarAbsorptance: 0.95 }; // soot 0.95, black paint 0.975 [P]

/** Filament materials with sourced properties (trade-facts §2a, §2e) and example prices. */
export const DEFAULT_MATERIALS: Material[] = [
  {
    id: 'pla',
    name: 'PLA',
    densityGcm3: 1.24, // NatureWorks Ingeo 4043D TDS, ASTM D792 (trade-facts §2e [P])
    priceCentsPerKg: 2500, // retail 1 kg spools ≈ US$15–25/kg [M]; a fablab price €32/kg [P]
    heatDeflectionC: 55, // Ingeo 2003D heat distortion at 0.45 MPa (trade-facts §2e [P]); PolyTerra 57.8 [P]
    glassTransitionC: 58, // 55–60, Ingeo 4043D (trade-facts §2e [P])
    thermalConductivityWmK: 0.13, // MakeItFrom data sheet (trade-facts §2a [P]); 0.12 Zmeskal [P]; 0.267 GHP [P] disagrees
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
  {
    id: 'petg',
    name: 'PETG',
    densityGcm3: 1.27, // trade-facts §2e [M], fabbaloo filament list [P]
    priceCentsPerKg: 2800, // assumption, no source
    heatDeflectionC: 70, // unfilled filament ~70 (trade-facts §2e [M])
    glassTransitionC: 80, // 75–85 additive.tools (trade-facts §2e [P])
    thermalConductivityWmK: 0.2, // ~0.2 (trade-facts §2a [M])
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
  {
    id: 'asa',
    name: 'ASA',
    densityGcm3: 1.07, // renato.design (trade-facts §2e [P])
    priceCentsPerKg: 3200, // assumption, no source
    heatDeflectionC: 90, // 90–100 at 0.45 MPa, renato.design (trade-facts §2e [P]); lower end used
    glassTransitionC: 100, // ≈ 100 (trade-facts §2e [P])
    thermalConductivityWmK: 0.17, // from memory: ABS-family polymers ≈ 0.17; not in the reference
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
];

/** Default print settings: 3 walls, 4 top and bottom layers, 15 % infill (common practice, no source). */
export const DEFAULT_SETTINGS: PrintSettings = {
  wallLoops: 3, // 3 perimeters recommended for parts (trade-facts §3 [M])
  topLayers: 4,
  bottomLayers: 4,
  infillPct: 15,
  supportInfillPct: 15,
  printSpeedMmS: 100, // 0.2 × 0.45 × 100 = 9 mm³/s (trade-facts §4 [C])
  flowEfficiency: 0.7, // assumption: calibrate against slicer estimates
  travelOverheadPct: 10, // assumption, no source
};

/** Default money rates of the demo studio (an invented scenario; every studio sets its own). */
export const DEFAULT_RATES: CostRates = {
  currency: 'EUR',
  electricityCentsPerKwh: 30, // assumption for the scenario
  labourCentsPerHour: 2500, // assumption for the scenario
  supportRemovalMinPerCm3: 1, // assumption, no source
  handlingMinPerUnit: 3, // assumption, no source
  packagingCents: 120, // assumption for the scenario
  failureAllowancePct: 5, // assumption, no source
  marginPct: 40, // assumption for the scenario
};
