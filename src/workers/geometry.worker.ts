/// <reference lib="webworker" />
/**
 * The geometry worker: builds a template (the same generate() the server export uses), analyses the mesh and
 * answers with transferable typed arrays, so the page never freezes while a design is rebuilt.
 */
import { generate } from '../../templates/generate';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import type { GeometryRequest, GeometryResponse } from './geometryProtocol';
import { computeDesignFigures } from './computeDesignFigures';

const scope = self as unknown as DedicatedWorkerGlobalScope;

async function handle(request: GeometryRequest): Promise<GeometryResponse> {
  const started = performance.now();
  try {
    const result = await generate(request.templateId, request.params);
    const built = performance.now();
    const { figures, overhangMask } = computeDesignFigures(result, request.printerId, request.region);
    const finished = performance.now();
    return {
      requestId: request.requestId,
      ok: true,
      templateVersion: result.template.version,
      mesh: result.mesh,
      overhangMask,
      facts: result.facts,
      figures,
      sha256: result.sha256,
      timingsMs: { build: built - started, analysis: finished - built, total: finished - started },
    };
  } catch (err) {
    if (err instanceof TemplateParamError) {
      return { requestId: request.requestId, ok: false, field: err.field, message: err.message };
    }
    const message = err instanceof Error ? err.message : String(err);
    return { requestId: request.requestId, ok: false, message: `The model could not be built: ${message}` };
  }
}

scope.onmessage = async (event: MessageEvent<GeometryRequest>) => {
  const response = await handle(event.data);
  // A Set: two views on one buffer must be listed once or postMessage throws.
  const transfer = new Set<Transferable>();
  if (response.ok) {
    transfer.add(response.mesh.positions.buffer);
    transfer.add(response.mesh.indices.buffer);
    if (response.overhangMask) transfer.add(response.overhangMask.buffer);
  }
  scope.postMessage(response, [...transfer]);
};
