/**
 * `npm run bench`: runs every bench/*.bench.ts file in turn and prints its figures.
 * `npm run bench -- analysis` runs only the files whose name contains "analysis".
 * Each bench/<name>.bench.ts registers itself by its file name (e.g. `npm run bench -- plan` for the run planner,
 * `npm run bench -- optimize` for the wall-recipe optimizer, `npm run bench -- preview` for the editor preview).
 * Flags after the name (`--json`, ...) are for the bench itself; with `--json` this runner writes its own lines to
 * stderr so stdout holds only the bench's JSON.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { cpus } from 'node:os';

const here = dirname(fileURLToPath(import.meta.url));
const filter = process.argv.slice(2).find((arg) => !arg.startsWith('--'));
const say = process.argv.includes('--json') ? console.error : console.log;
const files = readdirSync(here)
  .filter((name) => name.endsWith('.bench.ts') && (!filter || name.includes(filter)))
  .sort();

say(`Nestwright benchmarks: Node ${process.version}, ${cpus().length} cores (${cpus()[0]?.model ?? '?'})`);
for (const name of files) {
  say(`\n== ${name} ==`);
  const mod = (await import(pathToFileURL(join(here, name)).href)) as { default: () => Promise<void> };
  const started = performance.now();
  await mod.default();
  say(`(${name} took ${((performance.now() - started) / 1000).toFixed(1)} s)`);
}
