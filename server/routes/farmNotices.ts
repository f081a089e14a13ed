/**
 * `POST /api/webhooks/farm`: the farm's signed notices. Mounted before the API's JSON parser, because the signature
 * is checked over the exact bytes received. A wrong signature or a timestamp outside the replay window answers 400
 * and changes nothing; a notice seen before (same id) answers 200 and is not applied again.
 */
import { eq } from 'drizzle-orm';
import express, { Router } from 'express';
import { FarmNoticeSchema } from '../../shared/schemas/farm';
import type { AppContext } from '../context';
import { farmNotices } from '../db/schema';
import { applyWorkOrder } from '../farm/applyWorkOrder';
import { NOTICE_SIGNATURE_HEADER, NOTICE_TIMESTAMP_HEADER, verifyNotice } from '../farm/farmSignature';
import { farmRuntime } from '../farm/farmRuntime';
import { loadFarmEnv } from '../farm/farmEnv';
import { badRequest, HttpError } from '../http/HttpError';

/**
 * Builds the notice router (mounted at `/api/webhooks/farm`, public: the signature is the authentication).
 * @param ctx - the application context
 */
export function farmNoticesRouter(ctx: AppContext): Router {
  const router = Router();
  router.post('/', express.raw({ type: () => true, limit: '1mb' }), async (req, res) => {
    if (!req.get(NOTICE_SIGNATURE_HEADER) || !req.get(NOTICE_TIMESTAMP_HEADER))
      throw new HttpError(400, 'bad_signature', 'Notice refused: it is not signed.');
    const secret = farmRuntime(ctx)?.noticeSecret ?? loadFarmEnv().FARM_NOTICE_SECRET;
    if (!secret)
      throw new HttpError(503, 'farm_not_started', 'Farm notices are not accepted yet: the farm is not set up.');
    const raw = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const check = verifyNotice(
      secret,
      { timestamp: req.get(NOTICE_TIMESTAMP_HEADER), signature: req.get(NOTICE_SIGNATURE_HEADER) },
      raw,
    );
    if (!check.ok) throw new HttpError(400, 'bad_signature', `Notice refused: ${check.reason}.`);
    let json: unknown;
    try {
      json = JSON.parse(raw.toString('utf8'));
    } catch {
      throw badRequest('The notice is not JSON.');
    }
    const parsed = FarmNoticeSchema.safeParse(json);
    if (!parsed.success) throw badRequest('The notice does not have the shape of a farm notice.');
    const notice = parsed.data;
    const [stored] = await ctx.db
      .insert(farmNotices)
      .values({
        noticeId: notice.noticeId,
        workOrderId: notice.workOrder.id,
        kind: notice.kind,
        outcome: 'received',
        payload: json as Record<string, unknown>,
      })
      .onConflictDoNothing()
      .returning({ noticeId: farmNotices.noticeId });
    if (!stored) {
      res.json({ duplicate: true });
      return;
    }
    const applied = await applyWorkOrder(ctx, notice.workOrder, 'notice');
    await ctx.db
      .update(farmNotices)
      .set({ outcome: applied ? 'applied' : 'unknown work order' })
      .where(eq(farmNotices.noticeId, notice.noticeId));
    res.json({ duplicate: false, applied });
  });
  return router;
}
