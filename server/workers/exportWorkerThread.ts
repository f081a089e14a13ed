/**
 * Worker-thread entry of design exports: generates one template mesh per message and writes the file, off the
 * main thread. Protocol: in {@link ExportWorkerRequest}, out {@link ExportWorkerResponse}.
 */
import { parentPort } from 'node:worker_threads';
import { design3mf, type Design3mfChoice } from '../../shared/mesh/design3mf';
import { writeStl } from '../../shared/mesh/writeStl';
import { generate } from '../../templates/generate';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import { MeshValidationError } from '../../templates/lib/toMesh';

/** Export file formats. */
export type ExportFormat = 'stl' | '3mf';

/**
 * What to write: an STL (no plate), or a 3MF laid out on a plate. The plate is the caller's to give (the server takes
 * it from the studio's printers in the database); the worker has no printers of its own to fall back on.
 */
export type ExportTarget = { format: 'stl' } | { format: '3mf'; plate: Design3mfChoice };

/** A request to the worker. */
export type ExportWorkerRequest = { requestId: number; templateId: string; params: unknown } & ExportTarget;

/** The refusal of a 3MF request that came without a plate (a caller's mistake, said in words). */
export const NO_PLATE_MESSAGE =
  'a 3MF file is laid out on a printer plate, and no printer was given: choose one of the studio printers';

/** What a finished export carries besides the file. */
export interface ExportSummary {
  templateId: string;
  templateVersion: number;
  sha256: string;
  triangles: number;
  volumeMm3: number;
  partCount: number;
}

/** The worker's answer; `kind` tells the caller which HTTP status fits a failure. */
export type ExportWorkerResponse =
  | { requestId: number; ok: true; summary: ExportSummary; file: Uint8Array }
  | { requestId: number; ok: false; kind: 'params' | 'mesh' | 'failed'; field?: string; error: string };

async function handle(request: ExportWorkerRequest): Promise<ExportWorkerResponse> {
  // Typed callers cannot leave the plate out; a message from elsewhere is refused before any work is done.
  if (request.format === '3mf' && !request.plate)
    return { requestId: request.requestId, ok: false, kind: 'failed', error: NO_PLATE_MESSAGE };
  try {
    const result = await generate(request.templateId, request.params);
    const file = request.format === 'stl' ? writeStl(result.mesh) : design3mf(result, request.plate);
    return {
      requestId: request.requestId,
      ok: true,
      file,
      summary: {
        templateId: result.template.id,
        templateVersion: result.template.version,
        sha256: result.sha256,
        triangles: result.triangles,
        volumeMm3: result.volumeMm3,
        partCount: result.partCount,
      },
    };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    if (err instanceof TemplateParamError)
      return { requestId: request.requestId, ok: false, kind: 'params', field: err.field, error };
    if (err instanceof MeshValidationError) return { requestId: request.requestId, ok: false, kind: 'mesh', error };
    return { requestId: request.requestId, ok: false, kind: 'failed', error };
  }
}

parentPort?.on('message', (request: ExportWorkerRequest) => {
  void handle(request).then((response) => {
    const transfer = response.ok ? [response.file.buffer as ArrayBuffer] : [];
    parentPort?.postMessage(response, transfer);
  });
});
