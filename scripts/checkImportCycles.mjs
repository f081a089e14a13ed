// Fails (exit 1) when any module of the product imports itself through a chain of imports: `npm run check:cycles`,
// run by .ci/run. Type-only imports (`import type`) are left out: TypeScript erases them, so they cannot make modules
// load in a circle, and mutually referring types (a context that holds a queue whose jobs receive the context) are
// fine. madge walks the imports and resolves them the way TypeScript does (tsconfig.json); .vue files are read by
// their <script> blocks, and their own imports are resolved with the same TypeScript lookup as a .ts file in the same
// folder (madge's default guesses a JavaScript module format by parsing the whole component, which fails on the
// template).
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import madge from 'madge';

// The resolver madge itself uses (madge -> dependency-tree -> filing-cabinet), not a copy of our own.
const fromMadge = createRequire(fileURLToPath(import.meta.resolve('madge')));
const cabinet = createRequire(fromMadge.resolve('dependency-tree'))('filing-cabinet');

const tsLookup = cabinet.getLookup('.ts');
const vueLookup = cabinet.getLookup('.vue');
cabinet.register('.vue', (options) =>
  /\.(vue|css|scss)$/.test(options.dependency) ? vueLookup(options) : tsLookup(options),
);

const roots = ['src', 'server', 'shared', 'templates', 'tests', 'bench'];
const result = await madge(roots, {
  fileExtensions: ['ts', 'vue'],
  tsConfig: 'tsconfig.json',
  excludeRegExp: [/node_modules/, /\.d\.ts$/],
  detectiveOptions: { ts: { skipTypeImports: true }, vue: { skipTypeImports: true } },
});
const cycles = result.circular();
const skipped = result.warnings().skipped;
const graph = result.obj();
const files = Object.keys(graph).length;
// `--show` prints every module with the modules it imports.
if (process.argv.includes('--show')) for (const [file, deps] of Object.entries(graph)) console.log(file, deps);
if (cycles.length > 0) {
  console.error(`${cycles.length} import cycle(s) among ${files} modules:`);
  for (const cycle of cycles) console.error(`  ${[...cycle, cycle[0]].join(' -> ')}`);
  process.exit(1);
}
console.log(`No import cycles among ${files} modules.`);

if (skipped.length > 0) console.log(`Unresolved imports (not followed): ${skipped.join(', ')}`);
