import { TimedWorker } from './TimedWorker';
import type { ProductMesh } from '../services/specSheetMesh';
import type { ProductMeshWorkerRequest, ProductMeshWorkerResponse } from './productMeshWorkerThread';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';

/** The worker entry next to this file (TypeScript, loaded through tsx inside the worker). */
const WORKER_URL = new URL('./productMeshWorkerThread.ts', import.meta.url);

/** The longest one body may take to build: as long as an export may. */
export const PRODUCT_MESH_TIME_LIMIT_MS = 20_000;

let shared:
  TimedWorker<Omit<ProductMeshWorkerRequest, 'requestId'>, ProductMeshWorkerResponse, ProductMesh> | undefined;

function runner() {
  shared ??= new TimedWorker({
    entryUrl: WORKER_URL,
    jobName: 'drawing',
    timeLimitMs: PRODUCT_MESH_TIME_LIMIT_MS,
    timeoutError: (limitMs) => new Error(`building the product took longer than ${limitMs / 1000} s and was stopped`),
    failedError: (message) => new Error(message),
    settle: (message) => {
      if (message.ok) return message.product;
      if (message.field !== undefined) throw new TemplateParamError(message.field, message.error);
      throw new Error(message.error);
    },
  });
  return shared;
}

/**
 * A variant's body standing as it is used (see `productMesh`), built in the process's one drawing worker thread so
 * that a spec sheet or a shop model never holds up other requests. The thread starts on first use and never keeps
 * the process alive while idle.
 * @param templateId - a registered template id
 * @param params - template parameters (missing keys take defaults)
 * @throws TemplateParamError for an unknown template or a bad parameter
 */
export function productMeshInWorker(templateId: string, params: unknown): Promise<ProductMesh> {
  return runner().run({ templateId, params });
}

/** Stops the drawing thread (pending builds reject); the next request starts a new one. */
export async function closeProductMeshWorker(): Promise<void> {
  await shared?.close();
}
