import {
  CostRatesSchema,
  MaterialSchema,
  PrinterProfileSchema,
  PrintSettingsSchema,
  ProductionInputSchema,
  type CostBreakdown,
  type CostRates,
  type Finish,
  type Material,
  type PrinterProfile,
  type PrintSettings,
  type ProductionEstimate,
  type ProductionInput,
} from '../schemas/production';
import { filamentLengthM } from './filament';
import { volumetricFlowMm3s } from './volumetricFlow';

const MODEL_NOTES = [
  'Shell = side area × perimeters × line width, plus up- and down-facing area × top/bottom layers × layer height ' +
    '(the plate footprint stands in for both when the facing areas are unknown), capped at the part volume.',
  'Extruded volume = shell + infill % of the rest + support volume × support infill %.',
  'Print time = extruded volume / effective flow (target flow capped at the printer maximum, times the flow ' +
    'efficiency) + travel overhead + a fixed time per layer change. It is a lower-bound style model: a slicer ' +
    'estimate for the real part is better and should replace it for quotes.',
  'Energy = average printer power × print time; plate warm-up is counted per plate in farm capacity, not here.',
  'Failure allowance charges the material, machine time and energy of failed prints to the good ones.',
  "Post-processing = the finish's coating and packing minutes at the labour rate, plus its consumables.",
];

/**
 * Estimates mass, filament, print time, energy and unit cost of one part from its mesh measurements.
 * The model is stated in the result's `notes`; every cents value is rounded and the breakdown adds up to its total.
 * @param input - mesh measurements in build orientation (volume, area, height, support volume, footprint)
 * @param printer - the printer profile
 * @param material - the filament material
 * @param settings - print settings (walls, infill, speed)
 * @param rates - money rates of the studio, with its finishes
 * @param finishId - the variant's finish (a `rates.finishes` id); the first finish when null or omitted
 * @returns the production estimate
 */
export function estimateProduction(
  input: ProductionInput,
  printer: PrinterProfile,
  material: Material,
  settings: PrintSettings,
  rates: CostRates,
  finishId?: string | null,
): ProductionEstimate {
  return estimateProductionUnchecked(
    ProductionInputSchema.parse(input),
    PrinterProfileSchema.parse(printer),
    MaterialSchema.parse(material),
    PrintSettingsSchema.parse(settings),
    CostRatesSchema.parse(rates),
    finishId,
  );
}

/**
 * {@link estimateProduction} without validating its arguments, for searches that call it thousands of times with
 * values already parsed once (the wall-recipe optimizer).
 * @param part - parsed mesh measurements
 * @param p - parsed printer profile
 * @param m - parsed material
 * @param s - parsed print settings
 * @param r - parsed cost rates
 * @param finishId - a `rates.finishes` id; the first finish when null or omitted
 * @returns the production estimate
 */
export function estimateProductionUnchecked(
  part: ProductionInput,
  p: PrinterProfile,
  m: Material,
  s: PrintSettings,
  r: CostRates,
  finishId?: string | null,
): ProductionEstimate {
  const upMm2 = part.upFacingAreaMm2 ?? part.footprintMm2;
  const downMm2 = part.downFacingAreaMm2 ?? part.footprintMm2;
  const sideMm2 = Math.max(0, part.surfaceAreaMm2 - upMm2 - downMm2);
  const shellUncappedMm3 =
    sideMm2 * s.perimeters * p.lineWidthMm +
    upMm2 * s.topLayers * p.layerHeightMm +
    downMm2 * s.bottomLayers * p.layerHeightMm;
  const shellVolumeMm3 = Math.min(part.volumeMm3, shellUncappedMm3);
  const infillVolumeMm3 = (part.volumeMm3 - shellVolumeMm3) * (s.infillPct / 100);
  const supportExtrudedVolumeMm3 = part.supportVolumeMm3 * (s.supportInfillPct / 100);
  const extrudedVolumeMm3 = shellVolumeMm3 + infillVolumeMm3 + supportExtrudedVolumeMm3;

  const massG = (extrudedVolumeMm3 / 1000) * m.densityGcm3;
  const lengthM = filamentLengthM(massG, m.densityGcm3, p.filamentDiameterMm);

  const targetFlowMm3s = Math.min(
    volumetricFlowMm3s(p.layerHeightMm, p.lineWidthMm, s.printSpeedMmS),
    p.maxVolumetricFlowMm3s,
  );
  const effectiveFlowMm3s = targetFlowMm3s * s.flowEfficiency;
  const layers = Math.ceil(part.heightMm / p.layerHeightMm - 1e-9);
  const extrusionS = extrudedVolumeMm3 / effectiveFlowMm3s;
  const printTimeS = extrusionS * (1 + s.travelOverheadPct / 100) + layers * p.layerChangeS;
  const printTimeMin = printTimeS / 60;
  const printTimeH = printTimeS / 3600;
  const energyKwh = (p.averagePowerW * printTimeH) / 1000;

  const materialCents = (massG / 1000) * m.priceCentsPerKg;
  const machineTimeCents = printTimeH * p.machineRateCentsPerHour;
  const energyCents = energyKwh * r.electricityCentsPerKwh;
  const supportLabourCents = ((part.supportVolumeMm3 / 1000) * r.supportRemovalMinPerCm3 * r.labourCentsPerHour) / 60;
  const handlingLabourCents = (r.handlingMinPerUnit * r.labourCentsPerHour) / 60;
  const finish = finishOf(r, finishId);
  const postProcessingCents = finish
    ? ((finish.coatingMin + finish.packingMin) * r.labourCentsPerHour) / 60 + finish.consumablesCents
    : 0;
  const failureShare = r.failureAllowancePct / 100;
  const failureAllowanceCents = (materialCents + machineTimeCents + energyCents) * (failureShare / (1 - failureShare));

  const parts = {
    materialCents: Math.round(materialCents),
    machineTimeCents: Math.round(machineTimeCents),
    energyCents: Math.round(energyCents),
    supportLabourCents: Math.round(supportLabourCents),
    handlingLabourCents: Math.round(handlingLabourCents),
    postProcessingCents: Math.round(postProcessingCents),
    packagingCents: Math.round(r.packagingCents),
    failureAllowanceCents: Math.round(failureAllowanceCents),
  };
  const cost: CostBreakdown = {
    ...parts,
    totalCents: Object.values(parts).reduce((sum, cents) => sum + cents, 0),
  };

  return {
    shellVolumeMm3,
    infillVolumeMm3,
    supportExtrudedVolumeMm3,
    extrudedVolumeMm3,
    massG,
    filamentLengthM: lengthM,
    layers,
    effectiveFlowMm3s,
    printTimeMin,
    energyKwh,
    currency: r.currency,
    cost,
    suggestedPriceCents: Math.round(cost.totalCents / (1 - r.marginPct / 100)),
    notes: finish
      ? [...MODEL_NOTES]
      : [...MODEL_NOTES, `The finish "${finishId}" is not in the cost rates: no post-processing is counted.`],
  };
}

function finishOf(rates: CostRates, finishId: string | null | undefined): Finish | undefined {
  if (finishId === null || finishId === undefined) return rates.finishes[0];
  return rates.finishes.find((finish) => finish.id === finishId);
}
