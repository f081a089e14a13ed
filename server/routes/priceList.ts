/** The price list of published variants: `GET /api/price-list.csv` and `GET /api/price-list.xlsx`. */
import { Router } from 'express';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { sendAttachment } from '../pdf/sendAttachment';
import { listCatalogueVariants } from '../services/catalogue';
import { priceListCsv, priceListRows, priceListXlsx } from '../services/priceList';
import { loadMaterials } from '../services/familyProduction';
import { getStudioName } from '../services/studio';
import { isoDay } from '../../shared/format';

/**
 * Builds the price-list router (mounted at `/api`; each route checks its roles).
 * @param ctx - the application context
 */
export function priceListRouter(ctx: AppContext): Router {
  const router = Router();
  const sellers = requireRole('sales', 'catalogue_manager');
  const rows = async () => priceListRows(await listCatalogueVariants(ctx), await loadMaterials(ctx.db));
  const stamp = () => isoDay();

  router.get('/price-list.csv', sellers, async (_req, res) => {
    sendAttachment(res, priceListCsv(await rows()), 'text/csv; charset=utf-8', `price-list-${stamp()}.csv`);
  });

  router.get('/price-list.xlsx', sellers, async (_req, res) => {
    sendAttachment(
      res,
      await priceListXlsx(await rows(), await getStudioName(ctx.db)),
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
      `price-list-${stamp()}.xlsx`,
    );
  });

  return router;
}
