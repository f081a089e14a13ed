/**
 * Worker-thread entry of the family computation: builds and analyses one parameter set per message, off the main
 * thread. Protocol: in {@link VariantWorkerRequest}, out {@link VariantWorkerResponse}.
 */
import { parentPort } from 'node:worker_threads';
import { computeVariantGeometry, type VariantGeometry } from './variantGeometry';

/** A request to the worker. */
export interface VariantWorkerRequest {
  requestId: number;
  templateId: string;
  params: Record<string, unknown>;
}

/** The worker's answer. */
export type VariantWorkerResponse =
  { requestId: number; ok: true; geometry: VariantGeometry } | { requestId: number; ok: false; error: string };

parentPort?.on('message', (request: VariantWorkerRequest) => {
  computeVariantGeometry(request.templateId, request.params).then(
    (geometry) =>
      parentPort?.postMessage({ requestId: request.requestId, ok: true, geometry } satisfies VariantWorkerResponse),
    (err: unknown) =>
      parentPort?.postMessage({
        requestId: request.requestId,
        ok: false,
        error: err instanceof Error ? err.message : String(err),
      } satisfies VariantWorkerResponse),
  );
});
