/** `/api/analyses`: print-readiness reports of uploaded STL or 3MF files. */
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { AnalysisRequestSchema, type AnalysisRequest } from '../../shared/schemas/analysis';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { HttpError, badRequest, fieldProblem } from '../http/HttpError';
import { parsedBody, validate } from '../http/validate';
import { ANALYSIS_MAX_UPLOAD_BYTES, analysisCatalogue, analysisOptions, analyzeUpload } from '../services/analysis';
import { AnalysisWorker } from '../services/analysisWorker';
import { loadProductionCatalogue } from '../services/productionCatalogue';

/** Multipart upload of one mesh file in memory; a file over the limit is a bad mesh (400), like any other. */
const meshUpload: RequestHandler = (req, res, next) => {
  multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: ANALYSIS_MAX_UPLOAD_BYTES, files: 1, fields: 8 },
  }).single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        return next(
          new HttpError(
            400,
            'bad_mesh',
            `file: the file is larger than ${ANALYSIS_MAX_UPLOAD_BYTES / 1024 / 1024} MB`,
            {
              reason: 'too_large',
            },
          ),
        );
      }
      return next(badRequest(`${err.field ?? 'file'}: ${err.message}`));
    }
    next(err);
  });
};

/**
 * Builds the analyses router (mounted at `/api/analyses`): designers post a mesh file (multipart field `file`) with
 * optional fields up (+z…-y or auto), printerId, materialId, colourId, infillPct and overhangDeg, and get the report.
 * Printers and materials come from the database, or the built-in defaults when it holds none. The file is parsed
 * and analysed in a worker thread, so a large mesh does not hold up other requests.
 * @param ctx - the application context
 */
export function analysesRouter(ctx: AppContext): Router {
  const worker = new AnalysisWorker();
  const router = Router();
  router.post('/', requireRole('designer'), meshUpload, validate({ body: AnalysisRequestSchema }), async (req, res) => {
    if (!req.file) throw fieldProblem('file', 'Attach the STL or 3MF file to check.');
    const request = parsedBody<AnalysisRequest>(res);
    const catalogue = analysisCatalogue(await loadProductionCatalogue(ctx.db));
    const options = analysisOptions(request, catalogue);
    const bytes = new Uint8Array(req.file.buffer.buffer, req.file.buffer.byteOffset, req.file.buffer.byteLength);
    res.json(await analyzeUpload(worker, bytes, req.file.originalname, options));
  });
  return router;
}
