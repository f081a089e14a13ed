import { assessDesign, plainOutdoor } from '../../shared/assessment/assessDesign';
import { variantVerdict } from '../../shared/families/variantVerdict';
import { DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import type { Region, BirdFitWarning } from '../../shared/schemas/birdfit';
import type { VariantCost, VariantReport, VariantVerdict } from '../../shared/schemas/variant';
import type { Material, PrinterProfile } from '../../shared/schemas/production';
import type { VariantGeometry } from './variantGeometry';

/** Everything stored for one computed variant. */
export interface VariantEvaluation {
  report: VariantReport;
  cost: VariantCost;
  verdict: VariantVerdict;
  reasons: string[];
  birdFitWarnings: BirdFitWarning[];
}

/** What the evaluation needs beside the geometry. */
export interface EvaluationContext {
  printer: PrinterProfile;
  material: Material;
  supportBudgetMm3: number;
  region: Region | null;
  /** The variant's colour id (attributes.colour); null takes the material's first colour. */
  colourId?: string | null;
}

/**
 * Turns measured geometry into a variant's report, cost, bird-fit warnings and verdict. Each body must fit the
 * printer on its own (a box and its floor plug may go on separate plates); copies per plate counts complete sets
 * when a set fits one plate, otherwise the copies of the part that fits fewest (shared/analysis/fitParts.ts).
 * The outdoor assessment (sol-air roof and wall temperatures against the material's heat-deflection temperature)
 * is stored in the report; a surface above that temperature makes the verdict `warn` with a reason. The figures
 * come from the one design assessment (shared/assessment/assessDesign.ts).
 * @param geometry - what the worker measured
 * @param context - printer, material, support budget and region
 */
export function evaluateVariant(geometry: VariantGeometry, context: EvaluationContext): VariantEvaluation {
  const { printer, material } = context;
  const assessment = assessDesign(
    geometry,
    { printer, material, colourId: context.colourId, settings: DEFAULT_SETTINGS, rates: DEFAULT_RATES },
    { facts: geometry.facts, region: context.region },
  );
  const { fit, production, birdFit } = assessment;
  const warnings: string[] = [];
  if (fit.fits && fit.setsPerPlate === 0) warnings.push('the parts need separate build plates on this printer');
  if (geometry.maxBridgeSpanMm > 10)
    warnings.push(`longest bridge ${geometry.maxBridgeSpanMm.toFixed(1)} mm: check it prints cleanly`);
  const report: VariantReport = {
    triangles: geometry.triangles,
    volumeMm3: geometry.volumeMm3,
    surfaceAreaMm2: geometry.surfaceAreaMm2,
    watertight: geometry.watertight,
    openEdges: geometry.openEdges,
    nonManifoldEdges: geometry.nonManifoldEdges,
    components: geometry.components,
    partCount: geometry.partCount,
    bboxSizeMm: geometry.bboxSizeMm,
    overhangAreaMm2: geometry.overhangAreaMm2,
    supportVolumeMm3: geometry.supportVolumeMm3,
    maxBridgeSpanMm: geometry.maxBridgeSpanMm,
    thinnestWallMm: geometry.thinnestWallMm,
    printerId: printer.id,
    fitsPrinter: fit.fits,
    copiesPerPlate: fit.copiesPerPlate,
    massG: production.massG,
    filamentLengthM: production.filamentLengthM,
    printTimeMin: production.printTimeMin,
    facts: geometry.facts,
    warnings,
  };
  // The colour must be one of the material's colours; otherwise the report has no outdoor section.
  if (assessment.outdoor) report.outdoor = plainOutdoor(assessment.outdoor);
  const birdFitWarnings = birdFit?.warnings ?? [];
  const { verdict, reasons } = variantVerdict(report, context.supportBudgetMm3, birdFitWarnings, material.name);
  return {
    report,
    cost: {
      currency: production.currency,
      costCents: production.cost.totalCents,
      breakdown: production.cost,
      suggestedPriceCents: production.suggestedPriceCents,
    },
    verdict,
    reasons,
    birdFitWarnings,
  };
}
