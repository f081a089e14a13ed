/**
 * Production entry: reads the environment, boots on DATA_DIR serving dist/client, and shuts down cleanly on
 * SIGINT/SIGTERM (stop listening, close PGlite so the data directory is left consistent).
 */
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { boot } from './boot';
import { loadEnv } from './env';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const env = loadEnv();
const started = performance.now();
const server = await boot({
  env,
  dataDir: env.DATA_DIR,
  port: env.PORT,
  clientDir: resolve(root, 'dist/client'),
}).catch((err: unknown) => {
  if ((err as { code?: string }).code === 'EADDRINUSE')
    console.error(`Port ${env.PORT} is in use: stop the other server or set PORT.`);
  else console.error(err);
  process.exit(1);
});
console.log(
  `  server ready (${Math.round(performance.now() - started)} ms; ${Math.round(performance.now())} ms since the process started)`,
);
console.log(`Nestwright is ready at ${server.url}`);

let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: shutting down...`);
    server.close().then(
      () => {
        console.log('Stopped.');
        process.exit(0);
      },
      (err: unknown) => {
        console.error(err);
        process.exit(1);
      },
    );
  });
}
