/// <reference lib="webworker" />
/**
 * The geometry worker: builds a template (the same generate() the server export uses), posts the mesh at once, then
 * analyses it and posts the figures. Requests are handled one at a time in arrival order; when a newer request is
 * already waiting, the analysis of the older one is skipped. Meshes travel as transferable typed arrays.
 */
import '../zodJitless';
import { generate } from '../../templates/generate';
import { findTemplate } from '../../templates/index';
import { liveLimits } from '../../templates/lib/liveLimits';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import type { GeometryRequest, GeometryResponse } from './geometryProtocol';
import { computeDesignFigures } from './computeDesignFigures';

const scope = self as unknown as DedicatedWorkerGlobalScope;
let newestRequestId = 0;
let queue: Promise<void> = Promise.resolve();

function post(response: GeometryResponse, transfer: ArrayBufferLike[] = []): void {
  // A Set: two views on one buffer must be listed once or postMessage throws.
  scope.postMessage(response, [...new Set(transfer)] as Transferable[]);
}

function fail(requestId: number, err: unknown): void {
  if (err instanceof TemplateParamError) post({ requestId, ok: false, field: err.field, message: err.message });
  else
    post({
      requestId,
      ok: false,
      message: `The model could not be built: ${err instanceof Error ? err.message : String(err)}`,
    });
}

/** Lets queued messages arrive (they update newestRequestId) before deciding whether to analyse. */
function yieldToMessages(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

async function handle(request: GeometryRequest): Promise<void> {
  const { requestId } = request;
  const started = performance.now();
  const template = findTemplate(request.templateId);
  if (template) post({ requestId, ok: true, stage: 'limits', limits: liveLimits(template, request.params) });
  let result;
  try {
    result = await generate(request.templateId, request.params, { moved: request.moved });
  } catch (err) {
    fail(requestId, err);
    return;
  }
  // Send copies so the worker keeps its own arrays for the analysis.
  const mesh = { positions: result.mesh.positions.slice(), indices: result.mesh.indices.slice() };
  post(
    {
      requestId,
      ok: true,
      stage: 'mesh',
      templateVersion: result.template.version,
      mesh,
      facts: result.facts,
      sha256: result.sha256,
      partNames: result.partNames,
      partTriangles: result.partTriangles,
      buildMs: performance.now() - started,
    },
    [mesh.positions.buffer, mesh.indices.buffer],
  );
  await yieldToMessages();
  if (newestRequestId > requestId) {
    post({ requestId, ok: true, stage: 'skipped' });
    return;
  }
  try {
    const analysisStarted = performance.now();
    const { figures, overhangMask } = computeDesignFigures(result, request.production, request.region);
    post(
      { requestId, ok: true, stage: 'figures', figures, overhangMask, analysisMs: performance.now() - analysisStarted },
      overhangMask ? [overhangMask.buffer] : [],
    );
  } catch (err) {
    post({
      requestId,
      ok: false,
      message: `The figures could not be computed: ${err instanceof Error ? err.message : String(err)}`,
    });
  }
}

scope.onmessage = (event: MessageEvent<GeometryRequest>) => {
  const request = event.data;
  newestRequestId = Math.max(newestRequestId, request.requestId);
  queue = queue.then(() => handle(request));
};
