/**
 * `npm start`: builds the client when dist/client is missing or older than the newest source file, then runs the
 * server (./index.ts). Prints the time of each stage.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const builtIndex = join(root, 'dist/client/index.html');

/** Newest modification time (ms) of the files under the paths that go into the client bundle. */
function newestSourceMtimeMs(paths: string[]): number {
  let newest = 0;
  const visit = (path: string): void => {
    if (!existsSync(path)) return;
    const stat = statSync(path);
    if (stat.isDirectory()) {
      for (const entry of readdirSync(path)) if (entry !== 'node_modules') visit(join(path, entry));
    } else if (!path.endsWith('.md')) newest = Math.max(newest, stat.mtimeMs);
  };
  paths.forEach(visit);
  return newest;
}

const t0 = performance.now();
const sources = ['src', 'shared', 'templates', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'].map((p) =>
  join(root, p),
);
const stale = !existsSync(builtIndex) || statSync(builtIndex).mtimeMs < newestSourceMtimeMs(sources);
if (stale) {
  console.log('Building the client (dist/client is missing or older than the sources)...');
  const { build } = await import('vite');
  await build({ root, logLevel: 'warn' });
  console.log(`  client built (${Math.round(performance.now() - t0)} ms)`);
} else {
  console.log(`  client is up to date (${Math.round(performance.now() - t0)} ms)`);
}
await import('./index');
