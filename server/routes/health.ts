/** `GET /api/health`: public liveness check. */
import { Router } from 'express';

/** The health router (no context needed). */
export function healthRouter(): Router {
  const router = Router();
  router.get('/', (_req, res) => {
    res.json({ ok: true });
  });
  return router;
}
