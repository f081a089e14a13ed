import type { GenerateResult } from '../../templates/generate';
import { assessDesign, measureDesign, plainOutdoor } from '../../shared/assessment/assessDesign';
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
 * per-triangle overhang mask for the viewer, from the one design assessment (shared/assessment/assessDesign.ts).
 * The mesh is already in build orientation (+z up); engines that are not available are listed in `unavailable`
 * rather than faked.
 * @param result - the generated design (full-quality mesh in build orientation, its parts' triangles, facts)
 * @param choice - printer, material, colour, print settings and cost rates
 * @param region - bird-fit region, both when omitted
 */
export function computeDesignFigures(
  result: Pick<GenerateResult, 'mesh' | 'partTriangles' | 'facts'>,
  choice: ProductionChoice,
  region?: Region,
): { figures: DesignFigures; overhangMask: Uint8Array | null } {
  const { printer, material, colour, settings, rates } = choice;
  // Parts (box body, floor plug) are laid side by side in the mesh but print on their own or packed: fit each part.
  const { measure, report, overhangMask } = measureDesign(result.mesh, {
    partTriangles: result.partTriangles,
    geometry: { up: '+z', supportMaxRays: PREVIEW_SUPPORT_RAYS, wallSamples: PREVIEW_WALL_SAMPLES },
  });
  const assessment = assessDesign(
    measure,
    { printer, material, colourId: colour.id, settings, rates },
    { facts: result.facts, region: region ?? null },
  );
  const unavailable: string[] = [];
  const outdoor = assessment.outdoor ? plainOutdoor(assessment.outdoor) : null;
  if (!assessment.outdoor) unavailable.push(`outdoor fitness (${assessment.outdoorProblem})`);
  return {
    figures: {
      volumeMm3: report.volumeMm3,
      surfaceAreaMm2: report.surfaceAreaMm2,
      boundingBoxMm: report.bbox.sizeMm,
      assembledSizeMm: assessment.assembledSizeMm,
      triangleCount: report.triangles,
      bodyCount: report.components,
      overhangAreaMm2: report.overhang.areaMm2,
      supportVolumeMm3: report.supportVolumeMm3,
      fitsPrinter: assessment.fit.fits,
      plate: {
        layout: assessment.plate.layout,
        platesPerUnit: assessment.plate.platesPerUnit,
        text: assessment.plate.text,
        tag: assessment.plate.tag,
      },
      production: assessment.production,
      outdoor,
      birdFit: assessment.birdFit,
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
