import type { ProductionInput } from '../schemas/production';
import type { WallSample } from '../schemas/wallRecipe';

const NUMERIC_KEYS = [
  'volumeMm3',
  'surfaceAreaMm2',
  'heightMm',
  'supportVolumeMm3',
  'footprintMm2',
  'upFacingAreaMm2',
  'downFacingAreaMm2',
] as const;

/**
 * The production input of a design at any wall thickness, from the design measured at a few thicknesses:
 * piecewise-linear between samples, extended linearly past the first and last (volume grows about linearly with
 * the wall; areas and heights change little). With one sample every thickness gets that sample.
 * @param samples - the design measured at distinct wall thicknesses (any order)
 * @returns a function of the wall thickness in mm
 */
export function interpolateWallSample(samples: readonly WallSample[]): (wallThicknessMm: number) => ProductionInput {
  const sorted = [...samples].sort((a, b) => a.wallThicknessMm - b.wallThicknessMm);
  if (sorted.length === 0) throw new Error('samples must hold at least one measured wall thickness');
  if (sorted.length === 1) {
    const only = sorted[0]!.input;
    return () => only;
  }
  return (t) => {
    let i = 0;
    while (i < sorted.length - 2 && t > sorted[i + 1]!.wallThicknessMm) i++;
    const a = sorted[i]!;
    const b = sorted[i + 1]!;
    const u = (t - a.wallThicknessMm) / (b.wallThicknessMm - a.wallThicknessMm);
    const lerp = (x: number, y: number): number => Math.max(0, x + (y - x) * u);
    const out: ProductionInput = {
      ...a.input,
      bboxSizeMm: [0, 1, 2].map((k) => lerp(a.input.bboxSizeMm[k]!, b.input.bboxSizeMm[k]!)) as [
        number,
        number,
        number,
      ],
    };
    for (const key of NUMERIC_KEYS) {
      const x = a.input[key];
      const y = b.input[key];
      if (x !== undefined && y !== undefined) out[key] = lerp(x, y);
    }
    return out;
  };
}
