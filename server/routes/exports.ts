/** `/api/exports`: print-ready STL or 3MF files of a template design, generated in a worker thread. */
import { Router } from 'express';
import { createHash } from 'node:crypto';
import type { AppContext } from '../context';
import { loadMaterials, loadPrinters } from '../services/familyProduction';
import { requireRole } from '../auth/requireRole';
import { parsedBody, validate } from '../http/validate';
import { ExportRequestSchema, exportDesign, type ExportRequest } from '../services/exportDesign';
import { ExportWorker, EXPORT_TIME_LIMIT_MS } from '../workers/ExportWorker';

const CONTENT_TYPES = { stl: 'model/stl', '3mf': 'model/3mf' } as const;

/** Options of {@link exportsRouter}. */
export interface ExportsRouterOptions {
  /** Longest one export may take before it is stopped (504). */
  timeLimitMs?: number;
}

/**
 * Builds the exports router (mounted at `/api/exports`): designers post `{ templateId, params, format }` and get the
 * file with headers X-Mesh-Sha256 (content hash of the mesh), X-File-Sha256 (sha256 of the file's bytes) and
 * X-Mesh-Triangles. Optional printerId, materialId and colourId lay a 3MF on that printer's plate in that material.
 * @param ctx - the application context (printers and materials)
 * @param options - time limit
 */
export function exportsRouter(ctx: AppContext, options: ExportsRouterOptions = {}): Router {
  const worker = new ExportWorker(options.timeLimitMs ?? EXPORT_TIME_LIMIT_MS);
  const router = Router();
  router.use(requireRole('designer'));

  router.post('/', validate({ body: ExportRequestSchema }), async (_req, res) => {
    const request = parsedBody<ExportRequest>(res);
    const [printers, materials] = await Promise.all([loadPrinters(ctx.db), loadMaterials(ctx.db)]);
    const { file, summary } = await exportDesign(worker, request, { printers, materials });
    const filename = `${summary.templateId}-v${summary.templateVersion}-${summary.sha256.slice(0, 8)}.${request.format}`;
    res.set({
      'Content-Type': CONTENT_TYPES[request.format],
      'Content-Disposition': `attachment; filename="${filename}"`,
      'X-Mesh-Sha256': summary.sha256,
      'X-File-Sha256': createHash('sha256').update(file).digest('hex'),
      'X-Mesh-Triangles': String(summary.triangles),
      'X-Mesh-Parts': String(summary.partCount),
      'X-Template-Version': String(summary.templateVersion),
      'Access-Control-Expose-Headers':
        'X-Mesh-Sha256, X-File-Sha256, X-Mesh-Triangles, X-Mesh-Parts, X-Template-Version',
    });
    res.send(Buffer.from(file.buffer, file.byteOffset, file.byteLength));
  });
  return router;
}
