import { fitPartSizes } from '../../shared/analysis/fitParts';
import { assessBirdFit } from '../../shared/birdfit/assessBirdFit';
import { variantVerdict } from '../../shared/families/variantVerdict';
import { estimateProduction } from '../../shared/production/estimateProduction';
import { assessOutdoor } from '../../shared/thermal/assessOutdoor';
import { DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import type { Region, BirdFitWarning } from '../../shared/schemas/birdfit';
import type { VariantCost, VariantReport, VariantVerdict } from '../../shared/schemas/variant';
import type { OutdoorAssessment } from '../../shared/schemas/outdoor';
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
 * is stored in the report; a surface above that temperature makes the verdict `warn` with a reason.
 * @param geometry - what the worker measured
 * @param context - printer, material, support budget and region
 */
export function evaluateVariant(geometry: VariantGeometry, context: EvaluationContext): VariantEvaluation {
  const { printer, material } = context;
  const plate = [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z];
  const partsFit = fitPartSizes(geometry.partSizesMm, plate);
  const fitsPrinter = partsFit.fits;
  const copiesPerPlate = partsFit.copiesPerPlate;
  const heightMm = partsFit.heightMm;
  const production = estimateProduction(
    {
      volumeMm3: geometry.volumeMm3,
      surfaceAreaMm2: geometry.surfaceAreaMm2,
      heightMm,
      supportVolumeMm3: geometry.supportVolumeMm3,
      bboxSizeMm: geometry.bboxSizeMm,
      footprintMm2: geometry.footprintMm2,
      upFacingAreaMm2: geometry.upFacingAreaMm2,
      downFacingAreaMm2: geometry.downFacingAreaMm2,
    },
    printer,
    material,
    DEFAULT_SETTINGS,
    DEFAULT_RATES,
  );
  const warnings: string[] = [];
  if (fitsPrinter && partsFit.setsPerPlate === 0) warnings.push('the parts need separate build plates on this printer');
  if (geometry.maxBridgeSpanMm > 10)
    warnings.push(`longest bridge ${geometry.maxBridgeSpanMm.toFixed(1)} mm: check it prints cleanly`);
  const birdFit = assessBirdFit(geometry.facts, context.region ? { region: context.region } : {});
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
    fitsPrinter,
    copiesPerPlate,
    massG: production.massG,
    filamentLengthM: production.filamentLengthM,
    printTimeMin: production.printTimeMin,
    facts: geometry.facts,
    warnings,
  };
  const outdoor = outdoorOf(geometry, context);
  if (outdoor) report.outdoor = outdoor;
  const { verdict, reasons } = variantVerdict(report, context.supportBudgetMm3, birdFit.warnings, material.name);
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
    birdFitWarnings: birdFit.warnings,
  };
}

/**
 * assessOutdoor for the variant's material and colour, with the template's wall thickness and the default print
 * settings; undefined when the colour is not one of the material's colours.
 */
function outdoorOf(geometry: VariantGeometry, context: EvaluationContext): OutdoorAssessment | undefined {
  const { material, printer } = context;
  const colourId = context.colourId ?? material.colours[0]!.id;
  if (!material.colours.some((colour) => colour.id === colourId)) return undefined;
  return assessOutdoor({
    material,
    colourId,
    wall: {
      wallThicknessMm: geometry.facts.wallThicknessMm,
      wallLoops: DEFAULT_SETTINGS.wallLoops,
      lineWidthMm: printer.lineWidthMm,
      infillPct: DEFAULT_SETTINGS.infillPct,
    },
  });
}
