// `npm start`: builds the client when dist/client is missing or older than its sources, bundles the server into
// dist/server/index.mjs with esbuild when the bundle is missing or older than its sources, then runs the bundle
// (server/index.ts: migrate, seed a new database, serve). Plain JavaScript run by node, so that a restart spends no
// time loading a TypeScript loader or transforming hundreds of files: a fresh clone still needs only
// `npm install && npm start`. Prints the time of each stage.
import { existsSync, mkdirSync, readdirSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const here = fileURLToPath(import.meta.url);

/** The server bundle `npm start` runs. */
const SERVER_BUNDLE = join(root, 'dist/server/index.mjs');

/**
 * Newest modification time (ms) of the files under some paths (node_modules and Markdown left out).
 * @param {string[]} paths - files or folders
 * @returns {number}
 */
function newestMtimeMs(paths) {
  let newest = 0;
  const visit = (path) => {
    if (!existsSync(path)) return;
    const stat = statSync(path);
    if (stat.isDirectory()) {
      for (const entry of readdirSync(path)) if (entry !== 'node_modules') visit(join(path, entry));
    } else if (!path.endsWith('.md')) newest = Math.max(newest, stat.mtimeMs);
  };
  paths.forEach(visit);
  return newest;
}

/**
 * True when `output` is missing or older than any of the sources.
 * @param {string} output - the built file
 * @param {string[]} sources - paths relative to the repository root
 */
function isStale(output, sources) {
  return !existsSync(output) || statSync(output).mtimeMs < newestMtimeMs(sources.map((p) => join(root, p)));
}

/**
 * An esbuild plugin that keeps `import.meta.url` of every bundled source file pointing at that file, so that paths
 * the server resolves from it (the migrations folder, worker thread entries, fonts) stay what they are in the sources.
 */
const keepModuleUrls = {
  name: 'keep-module-urls',
  setup(build) {
    build.onLoad({ filter: /\.ts$/ }, async (args) => {
      const text = await readFile(args.path, 'utf8');
      return {
        contents: text.replaceAll('import.meta.url', JSON.stringify(pathToFileURL(args.path).href)),
        loader: 'ts',
      };
    });
  },
};

/** Bundles server/index.ts (packages stay external: they are loaded from node_modules as usual). */
async function bundleServer() {
  const { build } = await import('esbuild');
  const result = await build({
    entryPoints: [join(root, 'server/index.ts')],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    // A map beside the bundle for `node --enable-source-maps` when debugging; not loaded by default (parsing it
    // would add a noticeable part of a second to every start).
    sourcemap: 'linked',
    outfile: SERVER_BUNDLE,
    write: false,
    logLevel: 'warning',
    plugins: [keepModuleUrls],
  });
  mkdirSync(dirname(SERVER_BUNDLE), { recursive: true });
  // Written beside and renamed, so that a server starting at the same moment never reads half a bundle.
  for (const file of result.outputFiles) {
    const partial = `${file.path}.${process.pid}.partial`;
    writeFileSync(partial, file.contents);
    renameSync(partial, file.path);
  }
}

const t0 = performance.now();
const clientSources = ['src', 'shared', 'templates', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'];
if (isStale(join(root, 'dist/client/index.html'), clientSources)) {
  console.log('Building the client (dist/client is missing or older than the sources)...');
  const { build } = await import('vite');
  await build({ root, logLevel: 'warn' });
  console.log(`  client built (${Math.round(performance.now() - t0)} ms)`);
} else {
  console.log(`  client is up to date (${Math.round(performance.now() - t0)} ms)`);
}

const t1 = performance.now();
const serverSources = ['server', 'shared', 'templates', 'package-lock.json', 'tsconfig.server.json'];
if (isStale(SERVER_BUNDLE, serverSources) || statSync(SERVER_BUNDLE).mtimeMs < statSync(here).mtimeMs) {
  await bundleServer();
  console.log(`  server bundled into dist/server (${Math.round(performance.now() - t1)} ms)`);
} else {
  console.log(`  server bundle is up to date (${Math.round(performance.now() - t1)} ms)`);
}
await import(pathToFileURL(SERVER_BUNDLE).href);
