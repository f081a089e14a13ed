/** Analysis of uploaded mesh files: pick the printer and material, then parse and analyse in a worker thread. */
import type { AnalyzeMeshOptions } from '../../shared/analysis/analyzeMesh';
import type { AnalysisReport, AnalysisRequest } from '../../shared/schemas/analysis';
import type { CostRates, Material, PrinterProfile, PrintSettings } from '../../shared/schemas/production';
import { HttpError, badRequest } from '../http/HttpError';
import { AnalysisError, type AnalysisWorker } from './analysisWorker';

/** Largest upload the API analyses (about 1.3 M triangles of binary STL): keeps one request to a few seconds. */
export const ANALYSIS_MAX_UPLOAD_BYTES = 64 * 1024 * 1024;

/** Printers and materials to choose from, by id, with the print settings and cost rates to estimate with. */
export interface AnalysisCatalogue {
  printers: Map<string, PrinterProfile>;
  materials: Map<string, Material>;
  settings: PrintSettings;
  rates: CostRates;
}

/**
 * The analysis catalogue from the production catalogue's lists.
 * @param catalogue - printers, materials, settings and rates (from the database, or the built-in defaults in the CLI)
 */
export function analysisCatalogue(catalogue: {
  printers: readonly PrinterProfile[];
  materials: readonly Material[];
  settings: PrintSettings;
  rates: CostRates;
}): AnalysisCatalogue {
  return {
    printers: new Map(catalogue.printers.map((p) => [p.id, p])),
    materials: new Map(catalogue.materials.map((m) => [m.id, m])),
    settings: catalogue.settings,
    rates: catalogue.rates,
  };
}

/**
 * The engine options for a request: the chosen (or first) printer and material, default settings with the requested
 * infill, and the default rates.
 * @param request - orientation, printer, material, colour, infill, overhang threshold
 * @param catalogue - printers and materials to choose from
 * @throws HttpError 400 for an unknown printer, material or colour
 */
export function analysisOptions(request: AnalysisRequest, catalogue: AnalysisCatalogue): AnalyzeMeshOptions {
  const material = pick(catalogue.materials, request.materialId, 'materialId');
  if (request.colourId !== undefined && !material.colours.some((c) => c.id === request.colourId)) {
    throw badRequest(
      `colourId: unknown colour "${request.colourId}" for ${material.id}; choose one of ${material.colours.map((c) => c.id).join(', ')}`,
    );
  }
  return {
    up: request.up,
    printer: pick(catalogue.printers, request.printerId, 'printerId'),
    material,
    colourId: request.colourId,
    settings:
      request.infillPct === undefined ? catalogue.settings : { ...catalogue.settings, infillPct: request.infillPct },
    rates: catalogue.rates,
    overhangDeg: request.overhangDeg,
  };
}

/**
 * Parses an uploaded mesh file and returns the full print-readiness report, computed in the worker thread.
 * @param worker - the analysis worker
 * @param bytes - the file
 * @param filename - the uploaded name (for messages)
 * @param options - from {@link analysisOptions}
 * @throws HttpError 400 `bad_mesh` (details.reason) for a file that is not a readable mesh, 504 when over time
 */
export async function analyzeUpload(
  worker: AnalysisWorker,
  bytes: Uint8Array,
  filename: string | undefined,
  options: AnalyzeMeshOptions,
): Promise<AnalysisReport> {
  try {
    return await worker.run(bytes, filename, options);
  } catch (err) {
    if (err instanceof AnalysisError && err.kind === 'mesh') {
      throw new HttpError(400, 'bad_mesh', err.message, { reason: err.reason });
    }
    if (err instanceof AnalysisError && err.kind === 'timeout')
      throw new HttpError(504, 'analysis_timeout', err.message);
    throw err;
  }
}

function pick<T>(items: Map<string, T>, id: string | undefined, field: string): T {
  if (id === undefined) {
    const first = items.values().next();
    if (first.done) throw badRequest(`${field}: no ${field === 'printerId' ? 'printers' : 'materials'} are set up`);
    return first.value;
  }
  const item = items.get(id);
  if (!item) throw badRequest(`${field}: unknown id "${id}"; choose one of ${[...items.keys()].join(', ')}`);
  return item;
}
