import type { WallOptimizeOptions, WallOptimum } from '../../shared/schemas/wallRecipe';

/** A request to the wall-recipe worker: the design, the thickness range, and the optimizer's other options. */
export interface WallRecipeRequest {
  requestId: number;
  templateId: string;
  /** The design's parameters (its wall thickness is varied). */
  params: Record<string, unknown>;
  /** Everything the optimizer needs except the measured samples, which the worker makes. */
  options: Omit<WallOptimizeOptions, 'samples'>;
}

/** What the worker answers: progress while it measures, then the optimum or a message for people. */
export type WallRecipeResponse =
  | { requestId: number; kind: 'progress'; done: number; total: number; stage: string }
  | { requestId: number; kind: 'done'; optimum: WallOptimum; measureMs: number; searchMs: number }
  | { requestId: number; kind: 'error'; message: string };
