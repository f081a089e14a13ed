/**
 * Studio settings, edited on the admin settings screen:
 * - `GET /api/settings/sales` (sales, catalogue managers, admin) and `PUT` (admin): sales settings;
 * - `GET|PUT /api/settings/studio` (admin): the studio's name and locale (money and dates are written in it);
 * - `GET|PUT /api/settings/production` (admin): print settings and cost rates;
 * - `PUT /api/settings/printers/:id` and `PUT /api/settings/materials/:id` (admin): add or change a printer profile,
 *   or a material with its colours (a colour a family uses cannot be taken out: 409 in words);
 * - `DELETE /api/settings/printers/:id` and `DELETE /api/settings/materials/:id` (admin): remove one, refused in
 *   words (409) while a family uses it or when it is the studio's last one.
 * Print settings and rates cannot drop a finish a family's variants use (409 in words).
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
  StudioSchema,
  type ProductionSettings,
  type StudioUpdate,
} from '../../shared/schemas/studioSettings';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { badRequest } from '../http/HttpError';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { getSalesSettings, saveSalesSettings } from '../services/salesSettings';
import { familiesUsingFinishes, refuseWhileUsed } from '../services/catalogueReferences';
import {
  loadProductionSettings,
  removeMaterial,
  removePrinter,
  saveMaterial,
  saveProductionSettings,
  savePrinter,
} from '../services/productionCatalogue';
import { getStudio, saveStudio } from '../services/studio';

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
    res.json(await getStudio(ctx.db));
  });

  router.put('/studio', admin, validate({ body: StudioSchema }), async (_req, res) => {
    res.json(await saveStudio(ctx.db, parsedBody<StudioUpdate>(res), signedInPerson(res).id));
  });

  router.get('/production', admin, async (_req, res) => {
    res.json(await loadProductionSettings(ctx.db));
  });

  router.put('/production', admin, validate({ body: ProductionSettingsSchema }), async (_req, res) => {
    const input = parsedBody<ProductionSettings>(res);
    const kept = new Set(input.rates.finishes.map((f) => f.id));
    const { rates } = await loadProductionSettings(ctx.db);
    const dropped = rates.finishes.filter((f) => !kept.has(f.id));
    for (const finish of dropped)
      refuseWhileUsed(await familiesUsingFinishes(ctx.db, [finish.id]), `The finish “${finish.name}”`, 'taken out');
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
    // The service refuses (409 in words) to take out a colour a family uses, checked and saved in one transaction.
    const { created } = await saveMaterial(ctx.db, material, signedInPerson(res).id);
    res.status(created ? 201 : 200).json(material);
  });

  // The service checks, deletes and records the removal in one transaction (404, 409 in words).
  router.delete('/printers/:id', admin, validate({ params: IdParamsSchema }), async (_req, res) => {
    await removePrinter(ctx.db, parsedParams<{ id: string }>(res).id, signedInPerson(res).id);
    res.status(204).end();
  });

  router.delete('/materials/:id', admin, validate({ params: IdParamsSchema }), async (_req, res) => {
    await removeMaterial(ctx.db, parsedParams<{ id: string }>(res).id, signedInPerson(res).id);
    res.status(204).end();
  });

  return router;
}
