import { fitPartSizes } from '../../shared/analysis/fitParts';
import { measureDesign, productionInputOf } from '../../shared/assessment/assessDesign';
import type { WallSample } from '../../shared/schemas/wallRecipe';
import { generate } from '../../templates/generate';

/** Small sample budgets: a sample feeds only volume, areas, height and support, not the full report. */
const SAMPLE_SUPPORT_RAYS = 8_000;
const SAMPLE_WALL_RAYS = 50;

/**
 * The design measured at a few wall thicknesses for the wall-recipe optimizer: each thickness is generated with the
 * template and measured in build orientation by the one design measure (shared/assessment/assessDesign.ts): volume,
 * areas, printed height of the tallest part, support.
 * @param templateId - the template
 * @param params - the design's other parameters
 * @param thicknessesMm - wall thicknesses to measure (e.g. the ends and middle of the live range)
 * @param plateMm - the printer's build volume, to find the printed height part by part
 * @returns one sample per thickness
 */
export async function measureWallSamples(
  templateId: string,
  params: Record<string, unknown>,
  thicknessesMm: readonly number[],
  plateMm: [number, number, number],
): Promise<WallSample[]> {
  const samples: WallSample[] = [];
  for (const wallThicknessMm of thicknessesMm) {
    const result = await generate(templateId, { ...params, wallThicknessMm });
    const { measure } = measureDesign(result.mesh, {
      partTriangles: result.partTriangles,
      geometry: { up: '+z', supportMaxRays: SAMPLE_SUPPORT_RAYS, wallSamples: SAMPLE_WALL_RAYS },
    });
    const { heightMm } = fitPartSizes(measure.partSizesMm, plateMm);
    samples.push({ wallThicknessMm, input: productionInputOf(measure, heightMm) });
  }
  return samples;
}

/**
 * Thicknesses to measure across a range: both ends and evenly spaced points between them, on the step grid.
 * @param min - thinnest wall
 * @param max - thickest wall
 * @param step - the parameter's step
 * @param count - how many samples (at least 2 when the range is wider than a step)
 */
export function sampleThicknesses(min: number, max: number, step: number, count = 4): number[] {
  if (max - min < step) return [min];
  const out = new Set<number>();
  for (let i = 0; i < count; i++) {
    const raw = min + ((max - min) * i) / (count - 1);
    out.add(Math.min(max, Math.max(min, Math.round((raw - min) / step) * step + min)));
  }
  return [...out].sort((a, b) => a - b);
}
