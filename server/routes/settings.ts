/** Sales settings: `GET /api/settings/sales` (sales, catalogue managers, admin) and `PUT` (admin). */
import { Router } from 'express';
import { SalesSettingsSchema, type SalesSettings } from '../../shared/schemas/sales';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { parsedBody, validate } from '../http/validate';
import { getSalesSettings, saveSalesSettings } from '../services/salesSettings';

/**
 * Builds the settings router (mounted at `/api/settings`).
 * @param ctx - the application context
 */
export function settingsRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/sales', requireRole('sales', 'catalogue_manager', 'admin'), async (_req, res) => {
    res.json(await getSalesSettings(ctx.db));
  });

  router.put('/sales', requireRole('admin'), validate({ body: SalesSettingsSchema }), async (_req, res) => {
    res.json(await saveSalesSettings(ctx.db, parsedBody<SalesSettings>(res), signedInPerson(res).id));
  });

  return router;
}
