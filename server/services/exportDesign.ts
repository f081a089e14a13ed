import { z } from 'zod';
import { findTemplate } from '../../templates/index';
import { parseParams } from '../../templates/lib/parseParams';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import { HttpError, badRequest } from '../http/HttpError';
import { ExportError, type ExportResult, type ExportWorker } from '../workers/ExportWorker';

/** Body of `POST /api/exports`. */
export const ExportRequestSchema = z.object({
  templateId: z.string().min(1).max(100),
  params: z.record(z.string(), z.unknown()).default({}),
  format: z.enum(['stl', '3mf']),
});
/** Body of `POST /api/exports`. */
export type ExportRequest = z.infer<typeof ExportRequestSchema>;

function paramError(field: string, message: string): HttpError {
  const path = field === 'templateId' ? 'templateId' : `params.${field}`;
  return badRequest(message, [{ in: 'body', path, message }]);
}

/**
 * Checks the request (unknown template or parameter, out-of-range value -> 400 naming the field and its range), then
 * generates and writes the file in the worker. A build over the time limit answers 504, a build that fails or gives
 * an invalid mesh 422; the worker thread keeps the server responsive either way.
 * @param worker - the export worker
 * @param request - the parsed request body
 */
export async function exportDesign(worker: ExportWorker, request: ExportRequest): Promise<ExportResult> {
  const template = findTemplate(request.templateId);
  if (!template) throw paramError('templateId', `templateId: unknown template "${request.templateId}"`);
  try {
    parseParams(template, request.params);
  } catch (err) {
    if (err instanceof TemplateParamError) throw paramError(err.field, err.message);
    throw err;
  }
  try {
    return await worker.run(request.templateId, request.params, request.format);
  } catch (err) {
    if (!(err instanceof ExportError)) throw err;
    if (err.kind === 'params') throw paramError(err.field ?? 'params', err.message);
    if (err.kind === 'timeout') throw new HttpError(504, 'generation_timeout', `Export stopped: ${err.message}.`);
    if (err.kind === 'mesh')
      throw new HttpError(422, 'invalid_mesh', `The design did not give a printable mesh: ${err.message}.`);
    throw new HttpError(422, 'generation_failed', `The design could not be generated: ${err.message}.`);
  }
}
