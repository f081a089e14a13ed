import { AnalysisReportSchema, type AnalysisReport } from '../../shared/schemas/analysis';
import { api, ApiError } from './client';

/** Largest file the analysis accepts (the server's limit, checked here to spare a pointless upload). */
export const ANALYSIS_UPLOAD_MAX_BYTES = 64 * 1024 * 1024;

/** What to analyse a file for. */
export interface AnalysisChoice {
  /** `auto` searches for the best build orientation. */
  up: 'auto' | '+z' | '-z' | '+x' | '-x' | '+y' | '-y';
  printerId?: string;
  materialId?: string;
  colourId?: string;
}

/**
 * Uploads an STL or 3MF file for a print-readiness report (`POST /api/analyses`, multipart field `file`).
 * @param file - the mesh file
 * @param choice - orientation, printer, material and colour
 * @param signal - abort signal
 * @returns the report, checked by {@link AnalysisReportSchema}
 */
export async function analyseFile(file: File, choice: AnalysisChoice, signal?: AbortSignal): Promise<AnalysisReport> {
  if (file.size > ANALYSIS_UPLOAD_MAX_BYTES) {
    throw new ApiError(
      413,
      'too_large',
      `The file is ${(file.size / 1048576).toFixed(1)} MB; at most ${ANALYSIS_UPLOAD_MAX_BYTES / 1048576} MB is accepted.`,
    );
  }
  const form = new FormData();
  for (const [key, value] of Object.entries(choice)) if (value) form.append(key, value);
  form.append('file', file, file.name);
  return api('/analyses', { method: 'POST', body: form, schema: AnalysisReportSchema, signal });
}
