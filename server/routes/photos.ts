/** `/api/photos`: stored sample photos for signed-in people (uploads go through /api/families/:id/photos). */
import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { requireAuth } from '../auth/requireRole';
import { parsedParams, validate } from '../http/validate';
import { openPhoto } from '../services/photoService';

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
      const file = await openPhoto(ctx, parsedParams<{ id: string }>(res).id, size);
      res.set({
        'Content-Type': 'image/webp',
        'Content-Length': String(file.sizeBytes),
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'private, max-age=3600',
      });
      // Streamed: a client that goes away mid-download just ends the stream.
      await pipeline(file.body, res).catch((err: unknown) => {
        if (!res.headersSent) throw err;
      });
    });
  }
  return router;
}
