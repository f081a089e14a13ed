import type { GenerateResult } from '../../templates/generate';
import { analyzeGeometry } from '../../shared/analysis/analyzeGeometry';
import { fitParts } from '../../shared/analysis/fitParts';
import { estimateProduction } from '../../shared/production/estimateProduction';
import { productionInputFromGeometry } from '../../shared/production/productionInputFromGeometry';
import { assessBirdFit } from '../../shared/birdfit/assessBirdFit';
import { assessOutdoor } from '../../shared/thermal/assessOutdoor';
import type { Region } from '../../shared/schemas/birdfit';
import type { DesignFigures, ProductionChoice } from './geometryProtocol';

/**
 * Sample budgets for live preview: smaller than the export report's defaults so a slider drag stays responsive;
 * the figures shown are estimates either way (support by vertical rays, walls by sampled rays).
 */
const PREVIEW_SUPPORT_RAYS = 60_000;
const PREVIEW_WALL_SAMPLES = 1_500;

/**
 * The figures beside the model for one generated design on one printer, in one material and colour, and the
 * per-triangle overhang mask for the viewer. The mesh is already in build orientation (+z up); engines that are not
 * available are listed in `unavailable` rather than faked.
 * @param result - the generated design (mesh in build orientation, facts)
 * @param choice - printer, material, colour, print settings and cost rates
 * @param region - bird-fit region, both when omitted
 */
export function computeDesignFigures(
  result: GenerateResult,
  choice: ProductionChoice,
  region?: Region,
): { figures: DesignFigures; overhangMask: Uint8Array | null } {
  const { printer, material, colour, settings, rates } = choice;
  const plate = printer.buildVolumeMm;
  const { report, overhangMask } = analyzeGeometry(result.mesh, {
    up: '+z',
    supportMaxRays: PREVIEW_SUPPORT_RAYS,
    wallSamples: PREVIEW_WALL_SAMPLES,
  });
  const size = report.bbox.sizeMm;
  // Parts (box body, floor plug) are laid side by side in the mesh but print on their own or packed: fit each part.
  const fit = fitParts(result.mesh, result.partTriangles, [plate.x, plate.y, plate.z]);
  const production = estimateProduction(
    productionInputFromGeometry(report, fit.heightMm),
    printer,
    material,
    settings,
    rates,
  );
  const unavailable: string[] = [];
  let outdoor: DesignFigures['outdoor'] = null;
  try {
    // The side wall as printed: the template's wall thickness, the settings' perimeters and infill, the printer's line.
    outdoor = assessOutdoor({
      material,
      colourId: colour.id,
      wall: {
        wallThicknessMm: result.facts.wallThicknessMm,
        wallLoops: settings.wallLoops,
        lineWidthMm: printer.lineWidthMm,
        infillPct: settings.infillPct,
      },
    });
  } catch (err) {
    unavailable.push(`outdoor fitness (${err instanceof Error ? err.message : String(err)})`);
  }
  return {
    figures: {
      volumeMm3: report.volumeMm3,
      surfaceAreaMm2: report.surfaceAreaMm2,
      boundingBoxMm: size,
      triangleCount: report.triangles,
      bodyCount: report.components,
      overhangAreaMm2: report.overhang.areaMm2,
      supportVolumeMm3: report.supportVolumeMm3,
      fitsPrinter: fit.fits,
      production,
      outdoor,
      birdFit: assessBirdFit(result.facts, { region }),
      unavailable,
    },
    overhangMask,
  };
}

/**
 * Size of the axis-aligned bounding box of a position array.
 * @param positions - x, y, z per vertex in millimetres
 */
export function boundingSizeMm(positions: Float32Array): [number, number, number] {
  if (positions.length === 0) return [0, 0, 0];
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < positions.length; i += 3) {
    for (let axis = 0; axis < 3; axis++) {
      const value = positions[i + axis];
      if (value < min[axis]) min[axis] = value;
      if (value > max[axis]) max[axis] = value;
    }
  }
  return [max[0] - min[0], max[1] - min[1], max[2] - min[2]];
}
