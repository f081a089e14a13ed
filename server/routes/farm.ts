/**
 * `/api/farm`: the exceptions queue and its actions (operations), demand, plannable variants, run plans, runs and
 * the print files they name (operations and catalogue managers). Admins may do all of it.
 */
import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import { z } from 'zod';
import {
  CancelDispatchRequestSchema,
  DemandQuerySchema,
  DispatchIdParamsSchema,
  PlanRequestSchema,
  RedispatchRequestSchema,
  type PlanRequest,
  type RedispatchRequest,
} from '../../shared/schemas/fulfilment';
import { requireRole, signedInPerson } from '../auth/requireRole';
import type { AppContext } from '../context';
import { demandReport } from '../farm/demand';
import { installDispatchHook } from '../farm/dispatchOrders';
import { getDispatch, redispatch, withdrawDispatch } from '../farm/farmExceptions';
import { farmRuntime } from '../farm/farmRuntime';
import { listFarmExceptions, toDispatch } from '../farm/farmViews';
import { openPrintFile, PinnedMeshError } from '../farm/printFiles';
import { createRun, listRuns, planFromCatalogue } from '../farm/runPlans';
import { conflict } from '../http/HttpError';
import { parsedBody, parsedParams, parsedQuery, validate } from '../http/validate';
import { listCatalogueVariants } from '../services/catalogue';

const PrintFileParamsSchema = z.object({
  meshSha256: z.string().regex(/^[0-9a-f]{64}$/, 'A print file is named by the 64-digit mesh hash of a variant.'),
});

/**
 * Builds the farm router (mounted at `/api/farm`).
 * @param ctx - the application context
 */
export function farmRouter(ctx: AppContext): Router {
  installDispatchHook();
  const router = Router();
  const operations = requireRole('operations', 'admin');
  const planners = requireRole('operations', 'catalogue_manager', 'admin');

  router.get('/exceptions', operations, async (_req, res) => {
    res.json(await listFarmExceptions(ctx.db));
  });

  router.post(
    '/dispatches/:id/redispatch',
    operations,
    validate({ params: DispatchIdParamsSchema, body: RedispatchRequestSchema }),
    async (_req, res) => {
      const { id } = parsedParams<{ id: number }>(res);
      const row = await redispatch(ctx, id, parsedBody<RedispatchRequest>(res), signedInPerson(res).id);
      res.status(201).json(toDispatch(row));
    },
  );

  router.post(
    '/dispatches/:id/withdraw',
    operations,
    validate({ params: DispatchIdParamsSchema, body: CancelDispatchRequestSchema }),
    async (_req, res) => {
      const { id } = parsedParams<{ id: number }>(res);
      await withdrawDispatch(ctx, id, parsedBody<{ reason: string }>(res).reason, signedInPerson(res).id);
      res.json(toDispatch(await getDispatch(ctx, id)));
    },
  );

  router.get('/demand', planners, validate({ query: DemandQuerySchema }), async (_req, res) => {
    res.json(await demandReport(ctx, parsedQuery<{ weeks: number }>(res).weeks));
  });

  router.get('/variants', planners, async (_req, res) => {
    const variants = await listCatalogueVariants(ctx);
    res.json({
      variants: variants.map((v) => {
        const axes = Object.values(v.axisValues).map(String).join(', ');
        return {
          sku: v.sku,
          label: axes ? `${v.family.name} (${axes})` : v.family.name,
          materialId: v.attributes.material,
          colourId: v.attributes.colour ?? 'natural',
          priceCents: v.priceCents,
          costCents: v.cost.costCents,
          currency: v.currency,
        };
      }),
    });
  });

  router.post('/plans', planners, validate({ body: PlanRequestSchema }), async (_req, res) => {
    res.json(await planFromCatalogue(ctx, parsedBody<PlanRequest>(res)));
  });

  router.get('/runs', planners, async (_req, res) => {
    res.json({ runs: await listRuns(ctx) });
  });

  router.post('/runs', planners, validate({ body: PlanRequestSchema }), async (_req, res) => {
    const run = await createRun(ctx, parsedBody<PlanRequest>(res), signedInPerson(res).id);
    farmRuntime(ctx)?.nudge();
    res.status(201).json(run);
  });

  // The print file of a sold or planned mesh, as the farm receives it: streamed from the file store (built, checked
  // against the hash and stored first when no process has built it yet).
  router.get(
    '/print-files/:meshSha256.stl',
    planners,
    validate({ params: PrintFileParamsSchema }),
    async (_req, res) => {
      const { meshSha256 } = parsedParams<{ meshSha256: string }>(res);
      const file = await openPrintFile(ctx.db, ctx.files, meshSha256).catch((err: unknown) => {
        if (err instanceof PinnedMeshError) throw conflict('print_file_unavailable', `No print file: ${err.message}.`);
        throw err;
      });
      res.set({
        'Content-Type': 'model/stl',
        'Content-Length': String(file.sizeBytes),
        'Content-Disposition': `attachment; filename="${meshSha256.slice(0, 16)}.stl"`,
        'Cache-Control': 'private, max-age=3600',
      });
      await pipeline(file.body, res).catch((err: unknown) => {
        if (!res.headersSent) throw err;
      });
    },
  );

  return router;
}
