/**
 * Worker-thread entry of mesh analyses: parses one uploaded file per message and runs the shared engine, off the
 * main thread. Protocol: in {@link AnalysisWorkerRequest}, out {@link AnalysisWorkerResponse}.
 */
import { parentPort } from 'node:worker_threads';
import { analyzeMesh, type AnalyzeMeshOptions } from '../../shared/analysis/analyzeMesh';
import { MeshFormatError, type MeshFormatReason } from '../../shared/mesh/MeshFormatError';
import { parseMeshFile } from '../../shared/mesh/parseMeshFile';
import type { AnalysisReport } from '../../shared/schemas/analysis';

/** A request to the worker. */
export interface AnalysisWorkerRequest {
  requestId: number;
  bytes: Uint8Array;
  filename?: string;
  options: AnalyzeMeshOptions;
}

/** The worker's answer: the report, a refused file (with the reason) or another failure. */
export type AnalysisWorkerResponse =
  | { requestId: number; ok: true; report: AnalysisReport }
  | { requestId: number; ok: false; kind: 'mesh'; reason: MeshFormatReason; error: string }
  | { requestId: number; ok: false; kind: 'failed'; error: string };

/**
 * Parses and analyses one file; never throws.
 * @param request - the file and the analysis options
 */
export function handleAnalysis(request: AnalysisWorkerRequest): AnalysisWorkerResponse {
  try {
    const mesh = parseMeshFile(request.bytes, request.filename);
    return { requestId: request.requestId, ok: true, report: analyzeMesh(mesh, request.options).report };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    if (err instanceof MeshFormatError)
      return { requestId: request.requestId, ok: false, kind: 'mesh', reason: err.reason, error };
    return { requestId: request.requestId, ok: false, kind: 'failed', error };
  }
}

parentPort?.on('message', (request: AnalysisWorkerRequest) => {
  parentPort?.postMessage(handleAnalysis(request));
});
