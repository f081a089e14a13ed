/** Analysis of uploaded mesh files: parse, pick the printer and material, run the shared engine. */
import { analyzeMesh } from '../../shared/analysis/analyzeMesh';
import { MeshFormatError } from '../../shared/mesh/MeshFormatError';
import { parseMeshFile } from '../../shared/mesh/parseMeshFile';
import type { AnalysisReport, AnalysisRequest } from '../../shared/schemas/analysis';
import type { Material, PrinterProfile } from '../../shared/schemas/production';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../../shared/production/defaults';
import { HttpError, badRequest } from '../http/HttpError';

/** Largest upload the API analyses (about 1.3 M triangles of binary STL): keeps one request to a few seconds. */
export const ANALYSIS_MAX_UPLOAD_BYTES = 64 * 1024 * 1024;

/** Printers and materials to choose from, by id. */
export interface AnalysisCatalogue {
  printers: Map<string, PrinterProfile>;
  materials: Map<string, Material>;
}

/** The built-in printers and materials (used when the database holds none). */
export function defaultCatalogue(): AnalysisCatalogue {
  return {
    printers: new Map(DEFAULT_PRINTERS.map((p) => [p.id, p])),
    materials: new Map(DEFAULT_MATERIALS.map((m) => [m.id, m])),
  };
}

/**
 * Parses an uploaded mesh file and returns the full print-readiness report.
 * @param bytes - the file
 * @param filename - the uploaded name (for messages)
 * @param request - orientation, printer, material, infill
 * @param catalogue - printers and materials to choose from (the first of each is the default)
 * @throws HttpError 400 `bad_mesh` (details.reason) for a file that is not a readable mesh, 400 `bad_request` for an
 *   unknown printer or material
 */
export function analyzeUpload(
  bytes: Uint8Array,
  filename: string | undefined,
  request: AnalysisRequest,
  catalogue: AnalysisCatalogue,
): AnalysisReport {
  const printer = pick(catalogue.printers, request.printerId, 'printerId');
  const material = pick(catalogue.materials, request.materialId, 'materialId');
  let mesh;
  try {
    mesh = parseMeshFile(bytes, filename);
  } catch (err) {
    if (err instanceof MeshFormatError) throw new HttpError(400, 'bad_mesh', err.message, { reason: err.reason });
    throw err;
  }
  const settings = request.infillPct === undefined ? DEFAULT_SETTINGS : { ...DEFAULT_SETTINGS, infillPct: request.infillPct };
  return analyzeMesh(mesh, {
    up: request.up,
    printer,
    material,
    settings,
    rates: DEFAULT_RATES,
    overhangDeg: request.overhangDeg,
  }).report;
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
