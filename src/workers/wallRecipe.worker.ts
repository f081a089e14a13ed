/// <reference lib="webworker" />
/**
 * The wall-recipe worker: measures the design at a few wall thicknesses across the range (template build and
 * geometry), reporting progress, then runs the optimizer. Kept apart from the geometry worker so a search never
 * delays the live preview.
 */
import { optimizeWallRecipe } from '../../shared/economics/optimizeWallRecipe';
import type { WallSample } from '../../shared/schemas/wallRecipe';
import { measureWallSamples, sampleThicknesses } from './measureWallSamples';
import type { WallRecipeRequest, WallRecipeResponse } from './wallRecipeProtocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const SAMPLE_COUNT = 4;

scope.onmessage = async (event: MessageEvent<WallRecipeRequest>) => {
  const { requestId, templateId, params, options } = event.data;
  const post = (response: WallRecipeResponse): void => scope.postMessage(response);
  try {
    const range = options.wallRangeMm;
    const thicknesses = sampleThicknesses(range.min, range.max, range.step, SAMPLE_COUNT);
    const printer = options.printers[0]!;
    const plate: [number, number, number] = [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z];
    const started = performance.now();
    const samples: WallSample[] = [];
    for (const [i, t] of thicknesses.entries()) {
      post({ requestId, kind: 'progress', done: i, total: thicknesses.length, stage: `Building the ${t} mm wall` });
      samples.push(...(await measureWallSamples(templateId, params, [t], plate)));
    }
    post({ requestId, kind: 'progress', done: thicknesses.length, total: thicknesses.length, stage: 'Searching' });
    const measured = performance.now();
    const optimum = optimizeWallRecipe({ ...options, samples });
    post({ requestId, kind: 'done', optimum, measureMs: measured - started, searchMs: performance.now() - measured });
  } catch (err) {
    post({
      requestId,
      kind: 'error',
      message: `The wall recipe could not be worked out: ${err instanceof Error ? err.message : String(err)}`,
    });
  }
};
