/**
 * Worker-thread entry of design exports: generates one template mesh per message and writes the file, off the
 * main thread. Protocol: in {@link ExportWorkerRequest}, out {@link ExportWorkerResponse}.
 */
import { parentPort } from 'node:worker_threads';
import { design3mf, type Design3mfChoice } from '../../shared/mesh/design3mf';
import { DEFAULT_PRINTERS } from '../../shared/production/defaults';
import { writeStl } from '../../shared/mesh/writeStl';
import { generate } from '../../templates/generate';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import { MeshValidationError } from '../../templates/lib/toMesh';

/** Export file formats. */
export type ExportFormat = 'stl' | '3mf';

/** A request to the worker. */
export interface ExportWorkerRequest {
  requestId: number;
  templateId: string;
  params: unknown;
  format: ExportFormat;
  /** Printer plate and material a 3MF is laid out for (default: the first default printer, no material). */
  plate?: Design3mfChoice;
}

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
  try {
    const result = await generate(request.templateId, request.params);
    const file =
      request.format === 'stl'
        ? writeStl(result.mesh)
        : design3mf(result, request.plate ?? { buildVolumeMm: defaultBuildVolumeMm() });
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

function defaultBuildVolumeMm(): number[] {
  const { x, y, z } = DEFAULT_PRINTERS[0].buildVolumeMm;
  return [x, y, z];
}

parentPort?.on('message', (request: ExportWorkerRequest) => {
  void handle(request).then((response) => {
    const transfer = response.ok ? [response.file.buffer as ArrayBuffer] : [];
    parentPort?.postMessage(response, transfer);
  });
});
