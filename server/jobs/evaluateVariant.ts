import { assessDesign, plainOutdoor } from '../../shared/assessment/assessDesign';
import { plateRuleSummary } from '../../shared/analysis/plateRule';
import { variantVerdict } from '../../shared/families/variantVerdict';
import type { Region, BirdFitWarning } from '../../shared/schemas/birdfit';
import type { VariantCost, VariantReport, VariantVerdict } from '../../shared/schemas/variant';
import type { CostRates, Material, PrinterProfile, PrintSettings } from '../../shared/schemas/production';
import type { ProductionTargets } from '../../shared/schemas/wallRecipe';
import { checkTargets, describeTargetCheck } from '../../shared/economics/checkTargets';
import { wallInsulationFigures } from '../../shared/economics/insulationTarget';
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
  /** Print settings from the database, with the family's recipe applied. */
  settings: PrintSettings;
  /** Cost rates with the finishes, from the database. */
  rates: CostRates;
  /** The variant's finish (attributes.finish); null takes the first finish of the rates. */
  finishId?: string | null;
  /** The family's production targets; a variant over one fails. */
  targets?: ProductionTargets;
}

/**
 * Turns measured geometry into a variant's report, cost, bird-fit warnings and verdict. Each body must fit the
 * printer on its own (a box and its floor plug may go on separate plates); copies per plate counts complete sets
 * when a set fits one plate, otherwise the copies of the part that fits fewest (shared/analysis/fitParts.ts).
 * The outdoor assessment (sol-air roof and wall temperatures against the material's heat-deflection temperature)
 * is stored in the report; a surface above that temperature makes the verdict `warn` with a reason. The figures
 * come from the one design assessment (shared/assessment/assessDesign.ts). A variant over one of the family's
 * production targets (unit cost, print hours, mass, wall insulation) fails, with a reason saying by how much.
 * @param geometry - what the worker measured
 * @param context - printer, material, support budget, region, settings, rates, finish and targets
 */
export function evaluateVariant(geometry: VariantGeometry, context: EvaluationContext): VariantEvaluation {
  const { printer, material, settings, rates } = context;
  const assessment = assessDesign(
    geometry,
    { printer, material, colourId: context.colourId, settings, rates, finishId: context.finishId },
    { facts: geometry.facts, region: context.region },
  );
  const { fit, production, birdFit } = assessment;
  const warnings: string[] = [];
  if (fit.fits && fit.setsPerPlate === 0)
    warnings.push(`the parts need separate build plates: ${assessment.plate.text}`);
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
    partSizesMm: geometry.partSizesMm,
    overhangAreaMm2: geometry.overhangAreaMm2,
    supportVolumeMm3: geometry.supportVolumeMm3,
    maxBridgeSpanMm: geometry.maxBridgeSpanMm,
    thinnestWallMm: geometry.thinnestWallMm,
    printerId: printer.id,
    fitsPrinter: fit.fits,
    copiesPerPlate: fit.copiesPerPlate,
    plate: plateRuleSummary(assessment.plate),
    massG: production.massG,
    filamentLengthM: production.filamentLengthM,
    printTimeMin: production.printTimeMin,
    facts: geometry.facts,
    warnings,
    targetChecks: [],
  };
  // The colour must be one of the material's colours; otherwise the report has no outdoor section.
  if (assessment.outdoor) report.outdoor = plainOutdoor(assessment.outdoor);
  const birdFitWarnings = birdFit?.warnings ?? [];
  if (context.targets) {
    // The side wall as printed with the family's perimeters and infill (the template's designed thickness).
    const wall = wallInsulationFigures(
      geometry.facts.wallThicknessMm,
      settings.perimeters,
      printer.lineWidthMm,
      settings.infillPct,
      material.thermalConductivityWmK,
    );
    report.targetChecks = checkTargets(
      {
        unitCostCents: production.cost.totalCents,
        printTimeMin: production.printTimeMin,
        massG: production.massG,
        ...wall,
      },
      context.targets,
    );
  }
  const checked = variantVerdict(report, context.supportBudgetMm3, birdFitWarnings, material.name, printer.name);
  const missed = report.targetChecks.filter((check) => !check.met);
  const verdict: VariantVerdict = missed.length > 0 ? 'fail' : checked.verdict;
  const reasons = [...missed.map((check) => describeTargetCheck(check, production.currency)), ...checked.reasons];
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
