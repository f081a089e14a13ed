import { z } from 'zod';
import type { Design3mfChoice } from '../../shared/mesh/design3mf';
import type { Material, PrinterProfile } from '../../shared/schemas/production';
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
  /** Printer whose plate a 3MF's parts are laid on (default: the first printer). */
  printerId: z.string().min(1).max(100).optional(),
  /** Material and colour written into a 3MF's base materials (default: none). */
  materialId: z.string().min(1).max(100).optional(),
  colourId: z.string().min(1).max(100).optional(),
});
/** Body of `POST /api/exports`. */
export type ExportRequest = z.infer<typeof ExportRequestSchema>;

function paramError(field: string, message: string): HttpError {
  const topLevel = ['templateId', 'printerId', 'materialId', 'colourId'];
  const path = topLevel.includes(field) ? field : `params.${field}`;
  return badRequest(message, [{ in: 'body', path, message }]);
}

/** Printers and materials an export may name (the studio's, from the database). */
export interface ExportCatalogue {
  printers: ReadonlyMap<string, PrinterProfile>;
  materials: ReadonlyMap<string, Material>;
}

/**
 * The plate and material a 3MF is written for: the named printer (or the first one), and the named material and
 * colour (or none). An unknown id is a 400 naming the field.
 * @param request - the export request
 * @param catalogue - printers and materials to choose from
 */
export function exportPlate(request: ExportRequest, catalogue: ExportCatalogue): Design3mfChoice {
  const { printers, materials } = catalogue;
  const printer = request.printerId ? printers.get(request.printerId) : printers.values().next().value;
  if (!printer) throw paramError('printerId', "That printer is not one of the studio's printers.");
  const { x, y, z } = printer.buildVolumeMm;
  if (!request.materialId) return { buildVolumeMm: [x, y, z] };
  const material = materials.get(request.materialId);
  if (!material) throw paramError('materialId', "That material is not one of the studio's materials.");
  const colour = request.colourId ? material.colours.find((c) => c.id === request.colourId) : material.colours[0];
  if (!colour) throw paramError('colourId', `${material.name} does not come in that colour.`);
  return {
    buildVolumeMm: [x, y, z],
    material: { name: `${material.name}, ${colour.name}`, displayColour: colour.hex },
  };
}

/**
 * Checks the request (unknown template or parameter, out-of-range value -> 400 naming the field and its range), then
 * generates and writes the file in the worker. A build over the time limit answers 504, a build that fails or gives
 * an invalid mesh 422; the worker thread keeps the server responsive either way.
 * @param worker - the export worker
 * @param request - the parsed request body
 */
export async function exportDesign(
  worker: ExportWorker,
  request: ExportRequest,
  catalogue: ExportCatalogue = { printers: new Map(), materials: new Map() },
): Promise<ExportResult> {
  const template = findTemplate(request.templateId);
  if (!template) throw paramError('templateId', `There is no template called "${request.templateId}".`);
  try {
    parseParams(template, request.params);
  } catch (err) {
    if (err instanceof TemplateParamError) throw paramError(err.field, err.message);
    throw err;
  }
  try {
    return await worker.run(
      request.templateId,
      request.params,
      request.format === '3mf' ? { format: '3mf', plate: exportPlate(request, catalogue) } : { format: 'stl' },
    );
  } catch (err) {
    if (!(err instanceof ExportError)) throw err;
    if (err.kind === 'params') throw paramError(err.field ?? 'params', err.message);
    if (err.kind === 'timeout') throw new HttpError(504, 'generation_timeout', `Export stopped: ${err.message}.`);
    if (err.kind === 'mesh')
      throw new HttpError(422, 'invalid_mesh', `The design did not give a printable mesh: ${err.message}.`);
    throw new HttpError(422, 'generation_failed', `The design could not be generated: ${err.message}.`);
  }
}
