/**
 * Worker-thread entry of the spec-sheet and shop geometry: builds one variant's body standing as it is used, off
 * the main thread. Protocol: in {@link ProductMeshWorkerRequest}, out {@link ProductMeshWorkerResponse}.
 */
import { parentPort } from 'node:worker_threads';
import { productMesh, type ProductMesh } from '../services/specSheetMesh';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';

/** A request to the worker. */
export interface ProductMeshWorkerRequest {
  requestId: number;
  templateId: string;
  params: unknown;
}

/** The worker's answer; `field` is set when a parameter was at fault. */
export type ProductMeshWorkerResponse =
  | { requestId: number; ok: true; product: ProductMesh }
  | { requestId: number; ok: false; field?: string; error: string };

async function handle(request: ProductMeshWorkerRequest): Promise<ProductMeshWorkerResponse> {
  try {
    return { requestId: request.requestId, ok: true, product: await productMesh(request.templateId, request.params) };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    if (err instanceof TemplateParamError) return { requestId: request.requestId, ok: false, field: err.field, error };
    return { requestId: request.requestId, ok: false, error };
  }
}

parentPort?.on('message', (request: ProductMeshWorkerRequest) => {
  void handle(request).then((response) => {
    const transfer = response.ok
      ? [response.product.mesh.positions.buffer as ArrayBuffer, response.product.mesh.indices.buffer as ArrayBuffer]
      : [];
    parentPort?.postMessage(response, transfer);
  });
});
