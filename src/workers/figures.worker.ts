/// <reference lib="webworker" />
/**
 * The figures worker: analyses full-quality meshes (print readiness, outdoor fitness, bird fit) beside the geometry
 * worker, so an analysis never delays the next build. Only the newest mesh is analysed: a request that a newer one
 * overtook while it waited is answered `skipped`.
 */
import '../zodJitless';
import type { FiguresRequest, GeometryResponse } from './geometryProtocol';
import { computeDesignFigures } from './computeDesignFigures';

const scope = self as unknown as DedicatedWorkerGlobalScope;
let waiting: FiguresRequest | null = null;
let scheduled = false;

function analyse(): void {
  scheduled = false;
  const request = waiting;
  waiting = null;
  if (!request) return;
  const { requestId } = request;
  try {
    const started = performance.now();
    const { figures, overhangMask } = computeDesignFigures(request, request.production, request.region);
    const response: GeometryResponse = {
      requestId,
      ok: true,
      stage: 'figures',
      figures,
      overhangMask,
      analysisMs: performance.now() - started,
    };
    scope.postMessage(response, overhangMask ? [overhangMask.buffer] : []);
  } catch (err) {
    const response: GeometryResponse = {
      requestId,
      ok: false,
      message: `The figures could not be computed: ${err instanceof Error ? err.message : String(err)}`,
    };
    scope.postMessage(response);
  }
}

scope.onmessage = (event: MessageEvent<FiguresRequest>) => {
  if (waiting) {
    const skipped: GeometryResponse = { requestId: waiting.requestId, ok: true, stage: 'skipped' };
    scope.postMessage(skipped);
  }
  waiting = event.data;
  // Let messages already queued arrive first, so only the newest mesh is analysed.
  if (!scheduled) {
    scheduled = true;
    setTimeout(analyse, 0);
  }
};
