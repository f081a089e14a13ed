/**
 * `/api/orders` (operations and admin): list with filter, search and pages; one order with its history; move it
 * along (in production, shipped with tracking, delivered); clear a payment flag once checked; cancel an unpaid order
 * or refund a paid one.
 */
import { Router } from 'express';
import {
  OrderCancelRequestSchema,
  OrderClearFlagRequestSchema,
  OrderIdParamsSchema,
  OrderListQuerySchema,
  OrderTransitionRequestSchema,
  type OrderCancelRequest,
  type OrderClearFlagRequest,
  type OrderListQuery,
  type OrderTransitionRequest,
} from '../../shared/schemas/order';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { fieldProblem } from '../http/HttpError';
import { parsedBody, parsedParams, parsedQuery, validate } from '../http/validate';
import { cancelOrder } from '../services/checkoutService';
import { kickMail } from '../services/mailService';
import { clearPaymentFlag } from '../services/orderService';
import { get, list, listAll } from '../services/orderQueries';
import { transition } from '../services/orderTransitions';
import { ordersCsv } from '../services/ordersCsv';
import { sendAttachment } from '../pdf/sendAttachment';
import { isoDay } from '../../shared/format';

/**
 * Builds the orders router (mounted at `/api/orders`).
 * @param ctx - the application context
 */
export function ordersRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireRole('operations', 'admin'));
  const idParams = validate({ params: OrderIdParamsSchema });

  router.get('/', validate({ query: OrderListQuerySchema }), async (_req, res) => {
    res.json(await list(ctx.db, parsedQuery<OrderListQuery>(res)));
  });

  router.get('/export.csv', validate({ query: OrderListQuerySchema }), async (_req, res) => {
    const { state, q, flagged } = parsedQuery<OrderListQuery>(res);
    const csv = ordersCsv(await listAll(ctx.db, { state, q, flagged }));
    sendAttachment(res, csv, 'text/csv; charset=utf-8', `orders-${isoDay()}.csv`);
  });

  router.get('/:id', idParams, async (_req, res) => {
    res.json(await get(ctx.db, parsedParams<{ id: string }>(res).id));
  });

  router.post(
    '/:id/transition',
    validate({ params: OrderIdParamsSchema, body: OrderTransitionRequestSchema }),
    async (_req, res) => {
      const body = parsedBody<OrderTransitionRequest>(res);
      if (body.to === 'shipped' && !body.trackingUrl)
        throw fieldProblem('trackingUrl', 'A shipped order needs the tracking link for the customer.');
      const order = await transition(ctx.db, parsedParams<{ id: string }>(res).id, body.to, signedInPerson(res), {
        trackingUrl: body.trackingUrl,
        note: body.note,
      });
      kickMail(ctx);
      res.json(order);
    },
  );

  router.post(
    '/:id/cancel',
    validate({ params: OrderIdParamsSchema, body: OrderCancelRequestSchema }),
    async (_req, res) => {
      const { reason } = parsedBody<OrderCancelRequest>(res);
      res.json(await cancelOrder(ctx, parsedParams<{ id: string }>(res).id, signedInPerson(res), reason));
    },
  );

  router.post(
    '/:id/clear-flag',
    validate({ params: OrderIdParamsSchema, body: OrderClearFlagRequestSchema }),
    async (_req, res) => {
      const { note } = parsedBody<OrderClearFlagRequest>(res);
      const order = await clearPaymentFlag(ctx.db, parsedParams<{ id: string }>(res).id, signedInPerson(res), note);
      kickMail(ctx);
      res.json(order);
    },
  );

  return router;
}
