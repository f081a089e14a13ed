/** `/api/photos`: stored sample photos for signed-in people (uploads go through /api/families/:id/photos). */
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { requireAuth } from '../auth/requireRole';
import { parsedParams, validate } from '../http/validate';
import { readPhoto } from '../services/photoService';

const PhotoParamsSchema = z.object({ id: z.uuid() });

/**
 * Builds the photos router (mounted at `/api/photos`).
 * @param ctx - the application context
 */
export function photosRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireAuth);
  for (const [path, size] of [
    ['/:id', 'normal'],
    ['/:id/thumb', 'thumb'],
  ] as const) {
    router.get(path, validate({ params: PhotoParamsSchema }), async (_req, res) => {
      const bytes = await readPhoto(ctx, parsedParams<{ id: string }>(res).id, size);
      res.set({
        'Content-Type': 'image/webp',
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'private, max-age=3600',
      });
      res.send(bytes);
    });
  }
  return router;
}
