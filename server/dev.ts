/** `npm run dev`: the API and the Vite dev server (hot reload) on one port. */
import { readFile } from 'node:fs/promises';
import { createServer as createHttpServer } from 'node:http';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { boot } from './boot';
import { loadEnv } from './env';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const env = loadEnv({ NODE_ENV: 'development', ...process.env });
const { createServer } = await import('vite');
// One port: Vite's hot-reload WebSocket shares the HTTP server that serves the API and the pages.
const httpServer = createHttpServer();
const vite = await createServer({
  root,
  server: { middlewareMode: true, hmr: { server: httpServer } },
  appType: 'custom',
});

const server = await boot({
  env,
  dataDir: env.DATA_DIR,
  port: env.PORT,
  httpServer,
  extend(app) {
    app.use(vite.middlewares);
    // SPA fallback: every other GET gets index.html through Vite's transforms (HMR client, module graph).
    app.use(async (req, res, next) => {
      if (req.method !== 'GET') {
        next();
        return;
      }
      const template = await readFile(join(root, 'index.html'), 'utf8');
      res
        .status(200)
        .set('Content-Type', 'text/html')
        .end(await vite.transformIndexHtml(req.originalUrl, template));
    });
  },
});
console.log(`Nestwright (dev, hot reload) is ready at ${server.url}`);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    void Promise.all([vite.close(), server.close()]).then(() => process.exit(0));
  });
}
