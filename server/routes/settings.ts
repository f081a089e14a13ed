/**
 * Studio settings, edited on the admin settings screen:
 * - `GET /api/settings/sales` (sales, catalogue managers, admin) and `PUT` (admin): sales settings;
 * - `GET|PUT /api/settings/studio` (admin): the studio's name;
 * - `GET|PUT /api/settings/production` (admin): print settings and cost rates;
 * - `PUT /api/settings/printers/:id` and `PUT /api/settings/materials/:id` (admin): add or change a printer profile,
 *   or a material with its colours.
 * Everyone signed in reads printers, materials, settings and rates through `GET /api/production`.
 */
import { Router } from 'express';
import { z } from 'zod';
import { SalesSettingsSchema, type SalesSettings } from '../../shared/schemas/sales';
import {
  MaterialSchema,
  PrinterProfileSchema,
  type Material,
  type PrinterProfile,
} from '../../shared/schemas/production';
import {
  CatalogueIdSchema,
  ProductionSettingsSchema,
  StudioNameSchema,
  type ProductionSettings,
  type StudioName,
} from '../../shared/schemas/studioSettings';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { badRequest } from '../http/HttpError';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { getSalesSettings, saveSalesSettings } from '../services/salesSettings';
import {
  loadProductionSettings,
  saveMaterial,
  saveProductionSettings,
  savePrinter,
} from '../services/productionCatalogue';
import { getStudioName, saveStudioName } from '../services/studio';

const IdParamsSchema = z.object({ id: CatalogueIdSchema });

/**
 * Builds the settings router (mounted at `/api/settings`).
 * @param ctx - the application context
 */
export function settingsRouter(ctx: AppContext): Router {
  const router = Router();
  const admin = requireRole('admin');

  router.get('/sales', requireRole('sales', 'catalogue_manager', 'admin'), async (_req, res) => {
    res.json(await getSalesSettings(ctx.db));
  });

  router.put('/sales', admin, validate({ body: SalesSettingsSchema }), async (_req, res) => {
    res.json(await saveSalesSettings(ctx.db, parsedBody<SalesSettings>(res), signedInPerson(res).id));
  });

  router.get('/studio', admin, async (_req, res) => {
    res.json({ name: await getStudioName(ctx.db) });
  });

  router.put('/studio', admin, validate({ body: StudioNameSchema }), async (_req, res) => {
    const { name } = parsedBody<StudioName>(res);
    res.json({ name: await saveStudioName(ctx.db, name, signedInPerson(res).id) });
  });

  router.get('/production', admin, async (_req, res) => {
    res.json(await loadProductionSettings(ctx.db));
  });

  router.put('/production', admin, validate({ body: ProductionSettingsSchema }), async (_req, res) => {
    res.json(await saveProductionSettings(ctx.db, parsedBody<ProductionSettings>(res), signedInPerson(res).id));
  });

  router.put(
    '/printers/:id',
    admin,
    validate({ params: IdParamsSchema, body: PrinterProfileSchema }),
    async (_req, res) => {
      const { id } = parsedParams<{ id: string }>(res);
      const printer = parsedBody<PrinterProfile>(res);
      if (printer.id !== id) throw badRequest('The printer’s identifier cannot be changed once it is saved.');
      if (printer.minLayerHeightMm !== undefined && printer.minLayerHeightMm > printer.layerHeightMm)
        throw badRequest('The thinnest layer must not be thicker than the layer height the estimates use.');
      if (printer.maxLayerHeightMm !== undefined && printer.maxLayerHeightMm < printer.layerHeightMm)
        throw badRequest('The thickest layer must not be thinner than the layer height the estimates use.');
      const { created } = await savePrinter(ctx.db, printer, signedInPerson(res).id);
      res.status(created ? 201 : 200).json(printer);
    },
  );

  router.put('/materials/:id', admin, validate({ params: IdParamsSchema, body: MaterialSchema }), async (_req, res) => {
    const { id } = parsedParams<{ id: string }>(res);
    const material = parsedBody<Material>(res);
    if (material.id !== id) throw badRequest('The material’s identifier cannot be changed once it is saved.');
    const colourIds = material.colours.map((c) => c.id);
    const repeated = colourIds.find((c, i) => colourIds.indexOf(c) !== i);
    if (repeated) throw badRequest(`Two colours share the identifier “${repeated}”: give each colour its own.`);
    const { created } = await saveMaterial(ctx.db, material, signedInPerson(res).id);
    res.status(created ? 201 : 200).json(material);
  });

  return router;
}
