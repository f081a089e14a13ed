/** `/api/mail`: the messages the fake SMTP server captured and the outbox (admin only). */
import { Router } from 'express';
import type { AppContext } from '../context';
import { requireRole } from '../auth/requireRole';
import { listMail } from '../services/mailService';

/**
 * Builds the mail router (mounted at `/api/mail`).
 * @param ctx - the application context
 */
export function mailRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/messages', requireRole('admin'), async (_req, res) => {
    res.json(await listMail(ctx));
  });
  return router;
}
