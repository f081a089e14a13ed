import type { CostRates, Finish, Material, PrinterProfile, PrintSettings } from '../schemas/production';

// Values are marked [P] published (the source is named beside it), [M] from memory, [C] computed from published values.
// The printers, rates and prices are an invented farm for the demo studio; change them per studio.

/** Id of the farm profile that new families, the editor and the demo families start with. */
export const FARM_PRINTER_ID = 'rowan-farm-06';

// Machine-hour rates follow the generic cost model "machine rate = (annual depreciation + maintenance + facility +
// consumables) / productive hours per year" (additive.tools, "Cost of a 3D printed part"); electricity is charged
// apart from it (power × price). The purchase prices, lives and shares below are the invented studio's own figures.
const ROWAN_RATE_NOTE =
  'Machine rate 40 c/h = depreciation 10 c/h (EUR 1,500 over 3 years × 5,000 productive hours) + wear parts and ' +
  "maintenance 12 c/h + floor space, racks and ventilation 18 c/h (the studio's own assumptions).";

/**
 * The invented studio's farm: printer profiles with invented names and build volumes of our own (not those of any
 * machine on sale). Each profile is one machine with one nozzle: the farm's everyday 0.6 mm profile, a 0.8 mm profile
 * on the same machine, a 0.4 mm detail profile and a tall machine for big boxes. Every default names its source in
 * `sourceNote`; the farm should replace the flow limits with its own flow-test results.
 */
export const DEFAULT_PRINTERS: PrinterProfile[] = [
  {
    id: FARM_PRINTER_ID,
    name: 'Rowan farm 0.6 mm',
    buildVolumeMm: { x: 246, y: 238, z: 262 },
    nozzleMm: 0.6,
    layerHeightMm: 0.3,
    minLayerHeightMm: 0.15,
    maxLayerHeightMm: 0.45,
    lineWidthMm: 0.68,
    maxVolumetricFlowMm3s: 30,
    averagePowerW: 150,
    machineRateCentsPerHour: 40,
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5,
    plateWarmUpMin: 6,
    sourceNote:
      'Line width 0.68 mm = 113 % of the nozzle: slicers default to 100–120 % of the nozzle diameter ' +
      '(3D Printerly, "3D printing line width"), and a line should be at least 1.2 × the layer height (Inov3D). ' +
      'Layers 0.15–0.45 mm, 0.3 mm used: at most 75–80 % of the nozzle (common practice, no source). ' +
      'Flow cap 30 mm³/s: the ultra-high-flow hot-end class (Ellis\' Print Tuning Guide, "Determining max volumetric ' +
      'flow rate", 0.4 mm brass nozzle); a wider nozzle melts no faster than its hot end, so the same cap applies. ' +
      'Average power 150 W: a printer with a 300 × 300 mm bed averaged 189.5 W over a 1 h PLA print (3DPrintScape, ' +
      '"Do 3D printers use a lot of power"); the bed draws most and this bed is 65 % of that area (estimate). ' +
      ROWAN_RATE_NOTE,
  },
  {
    id: 'rowan-farm-08',
    name: 'Rowan farm 0.8 mm',
    buildVolumeMm: { x: 246, y: 238, z: 262 },
    nozzleMm: 0.8,
    layerHeightMm: 0.4,
    minLayerHeightMm: 0.2,
    maxLayerHeightMm: 0.6,
    lineWidthMm: 0.9,
    maxVolumetricFlowMm3s: 30,
    averagePowerW: 150,
    machineRateCentsPerHour: 40,
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5,
    plateWarmUpMin: 6,
    sourceNote:
      'The Rowan machine with a 0.8 mm nozzle. Line width 0.9 mm = 112 % of the nozzle (3D Printerly, "3D printing ' +
      'line width": 100–120 %), at least 1.2 × the 0.4 mm layer (Inov3D). Layers 0.2–0.6 mm: at most 75 % of the ' +
      "nozzle (common practice, no source). Flow cap 30 mm³/s: the same hot end as the 0.6 mm profile (Ellis' Print " +
      'Tuning Guide, ultra-high-flow class); wider lines then print no faster, they only make thicker walls. ' +
      'Power as the 0.6 mm profile. ' +
      ROWAN_RATE_NOTE,
  },
  {
    id: 'linnet-detail-04',
    name: 'Linnet detail 0.4 mm',
    buildVolumeMm: { x: 232, y: 226, z: 258 },
    nozzleMm: 0.4,
    layerHeightMm: 0.2,
    minLayerHeightMm: 0.08,
    maxLayerHeightMm: 0.3,
    lineWidthMm: 0.45,
    maxVolumetricFlowMm3s: 15,
    averagePowerW: 120,
    machineRateCentsPerHour: 35,
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5,
    plateWarmUpMin: 6,
    sourceNote:
      'For samples and fine trim. Line width 0.45 mm = 112 % of the nozzle (3D Printerly, "3D printing line width"); ' +
      '0.2 mm layers, the usual standard at 0.4 mm (common practice, no source). Flow cap 15 mm³/s: the mid-flow ' +
      "hot-end class, 13–15 mm³/s at 0.4 mm (Ellis' Print Tuning Guide). Power 120 W: the top of the 60–120 W " +
      'that desktop printers of this size draw with PLA (from memory). Machine rate 35 c/h: depreciation 7 c/h ' +
      "(EUR 1,000 over 3 years × 5,000 h), wear parts 10 c/h, floor space 18 c/h (the studio's own assumptions).",
  },
  {
    id: 'alder-tall-06',
    name: 'Alder tall 0.6 mm',
    buildVolumeMm: { x: 312, y: 296, z: 338 },
    nozzleMm: 0.6,
    layerHeightMm: 0.3,
    minLayerHeightMm: 0.15,
    maxLayerHeightMm: 0.45,
    lineWidthMm: 0.68,
    maxVolumetricFlowMm3s: 30,
    averagePowerW: 200,
    machineRateCentsPerHour: 55,
    filamentDiameterMm: 1.75,
    layerChangeS: 1.5,
    plateWarmUpMin: 8,
    sourceNote:
      'For owl, kestrel and duck boxes that the Rowan cannot hold. Nozzle, line, layers and flow cap as the Rowan ' +
      '0.6 mm profile (same sources). Power 200 W: a 300 × 300 mm bed printer averaged 189.5 W over a 1 h PLA ' +
      'print (3DPrintScape), this bed is slightly larger. Machine rate 55 c/h: depreciation 16 c/h (EUR 2,400 over ' +
      "3 years × 5,000 h), wear parts 14 c/h, floor space 25 c/h (the studio's own assumptions).",
  },
];

// Solar absorptance per colour (published solar absorptance tables, e.g. scirp.org paper 88555). Filament colours are not paints: these are colour-class
// estimates anchored on the published paint values, to be measured for each filament where it matters.
const WHITE = { id: 'white', name: 'White', hex: '#f4f2ec', solarAbsorptance: 0.25 }; // white enamel 0.252 [P]
const SAND = { id: 'sand', name: 'Sand', hex: '#d8c8a4', solarAbsorptance: 0.4 }; // between light cream 0.30 and light green 0.50 [P]; estimate
const MOSS = { id: 'moss-green', name: 'Moss green', hex: '#5f6f3a', solarAbsorptance: 0.65 }; // darker than light green 0.50 [P]; medium class 0.475–0.70; estimate
const BARK = { id: 'bark-brown', name: 'Bark brown', hex: '#5a4030', solarAbsorptance: 0.8 }; // dark class > 0.70 [P]; estimate
const BLACK = { id: 'black', name: 'Black', hex: '#1c1c1c', solarAbsorptance: 0.95 }; // soot 0.95, black paint 0.975 [P]

/** Filament materials with sourced properties (data sheets named beside each value) and example prices. */
export const DEFAULT_MATERIALS: Material[] = [
  {
    id: 'pla',
    name: 'PLA',
    densityGcm3: 1.24, // NatureWorks Ingeo 4043D TDS, ASTM D792
    priceCentsPerKg: 2500, // retail 1 kg spools ≈ US$15–25/kg [M]; a fablab price €32/kg [P]
    heatDeflectionC: 55, // Ingeo 2003D heat distortion at 0.45 MPa; PolyTerra 57.8 [P]
    glassTransitionC: 58, // 55–60, Ingeo 4043D
    thermalConductivityWmK: 0.13, // MakeItFrom data sheet; 0.12 Zmeskal [P]; 0.267 GHP [P] disagrees
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
  {
    id: 'petg',
    name: 'PETG',
    densityGcm3: 1.27, // from memory [M]; fabbaloo filament list [P]
    priceCentsPerKg: 2800, // assumption, no source
    heatDeflectionC: 70, // unfilled filament ~70, from memory [M]
    glassTransitionC: 80, // 75–85 additive.tools
    thermalConductivityWmK: 0.2, // ~0.2, from memory [M]
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
  {
    id: 'asa',
    name: 'ASA',
    densityGcm3: 1.07, // renato.design
    priceCentsPerKg: 3200, // assumption, no source
    heatDeflectionC: 90, // 90–100 at 0.45 MPa, renato.design; lower end used
    glassTransitionC: 100, // ≈ 100
    thermalConductivityWmK: 0.17, // from memory: ABS-family polymers ≈ 0.17; not in the reference
    colours: [WHITE, SAND, MOSS, BARK, BLACK],
  },
];

/**
 * Default print settings of the farm: 2 perimeters, 4 top and bottom layers, 15 % infill. With the farm's 0.68 mm
 * lines two perimeters make a 1.36 mm skin, the 1.2–1.35 mm that three 0.45 mm perimeters give and that is usually
 * recommended for parts (common practice, no source). The wall-recipe optimizer and each family may choose others.
 */
export const DEFAULT_SETTINGS: PrintSettings = {
  perimeters: 2,
  topLayers: 4,
  bottomLayers: 4,
  infillPct: 15,
  supportInfillPct: 15,
  // A moderate speed for enclosed farm machines (from memory); at 0.6 and 0.8 mm the hot end's flow cap binds first:
  // 0.3 mm × 0.68 mm × 150 mm/s = 30.6 mm³/s (Q = layer height × line width × speed).
  printSpeedMmS: 150,
  flowEfficiency: 0.7, // assumption: calibrate against slicer estimates
  travelOverheadPct: 10, // assumption, no source
};

/** Finishes of the demo studio with their hand work per unit (the studio's own time studies, invented). */
export const DEFAULT_FINISHES: Finish[] = [
  { id: 'none', name: 'Bare', coatingMin: 0, packingMin: 3, consumablesCents: 0 },
  // Masking the inside, one spray coat on the outside only, handling while it dries; about 15 ml of coating.
  { id: 'uv-clear-coat', name: 'UV clear coat', coatingMin: 6, packingMin: 3, consumablesCents: 45 },
];

/** Default money rates of the demo studio (an invented scenario; every studio sets its own). */
export const DEFAULT_RATES: CostRates = {
  currency: 'EUR',
  electricityCentsPerKwh: 30, // assumption for the scenario
  labourCentsPerHour: 2500, // assumption for the scenario
  supportRemovalMinPerCm3: 1, // assumption, no source
  handlingMinPerUnit: 2, // plate removal and a look over the part; assumption, no source
  packagingCents: 120, // carton and paper fill; assumption for the scenario
  // Share of farm prints that fail and are reprinted; their material, machine time and energy inflate the good
  // units' cost. The studio's own assumption: measure it from the farm's job log.
  failureAllowancePct: 6,
  marginPct: 40, // assumption for the scenario
  finishes: DEFAULT_FINISHES,
};
