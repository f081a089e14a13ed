/** Serving the built client (dist/client): files as they are, index.html for every other page (SPA fallback). */
import express, { Router } from 'express';
import { existsSync } from 'node:fs';
import { extname, join } from 'node:path';

/**
 * A router serving the built client, or an empty router when the folder holds no index.html. Hashed files under
 * /assets are cached for a year; index.html is revalidated on every visit so a new build shows at once. A GET for a
 * missing file (a path with an extension) falls through to a 404 instead of receiving the page.
 * @param clientDir - the folder `vite build` wrote (dist/client)
 */
export function serveClient(clientDir: string): Router {
  const router = Router();
  const indexHtml = join(clientDir, 'index.html');
  if (!existsSync(indexHtml)) return router;
  router.use(
    express.static(clientDir, {
      index: false,
      setHeaders(res, path) {
        if (path.startsWith(join(clientDir, 'assets'))) res.set('Cache-Control', 'public, max-age=31536000, immutable');
      },
    }),
  );
  router.use((req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || extname(req.path) !== '') {
      next();
      return;
    }
    res.set('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
  return router;
}
