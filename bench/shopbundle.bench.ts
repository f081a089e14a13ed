/**
 * `npm run bench -- shopbundle`: the gzip size of the JavaScript a browser loads for the shop's first page
 * (`/shop`): the entry script with every chunk it preloads, plus the listing view's chunk and its static imports.
 * The budget is 150 KB; the figure is printed, never asserted. Builds the client into a temporary folder with a
 * manifest (about a minute on a busy machine).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { build } from 'vite';

/** The shop's first-page budget, kilobytes of gzip JavaScript. */
const BUDGET_KB = 150;

interface ManifestChunk {
  file: string;
  imports?: string[];
  isEntry?: boolean;
}

/** Runs the bench. */
export default async function run(): Promise<void> {
  const outDir = mkdtempSync(join(tmpdir(), 'nestwright-shopbundle-'));
  try {
    await build({ logLevel: 'warn', build: { outDir, emptyOutDir: true, manifest: true } });
    const manifest = JSON.parse(readFileSync(join(outDir, '.vite/manifest.json'), 'utf8')) as Record<
      string,
      ManifestChunk
    >;
    const files = new Set<string>();
    const visit = (key: string) => {
      const chunk = manifest[key];
      if (!chunk || files.has(chunk.file)) return;
      files.add(chunk.file);
      for (const dep of chunk.imports ?? []) visit(dep);
    };
    const entry = Object.keys(manifest).find((key) => manifest[key].isEntry);
    if (!entry) throw new Error('no entry chunk in the manifest');
    visit(entry);
    const entryOnly = new Set(files);
    visit('src/views/shop/ShopListView.vue');
    let totalBytes = 0;
    const rows: string[] = [];
    for (const file of files) {
      const gz = gzipSync(readFileSync(join(outDir, file))).length;
      totalBytes += gz;
      rows.push(`  ${(gz / 1024).toFixed(1).padStart(7)} KB  ${file}${entryOnly.has(file) ? '' : '  (shop listing)'}`);
    }
    console.log(rows.sort().reverse().join('\n'));
    const kb = totalBytes / 1024;
    console.log(
      `shop first page (/shop): ${kb.toFixed(1)} KB gzip JavaScript (budget ${BUDGET_KB} KB: ${kb <= BUDGET_KB ? 'within' : 'OVER'})`,
    );
  } finally {
    rmSync(outDir, { recursive: true, force: true });
  }
}
