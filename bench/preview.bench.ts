/**
 * `npm run bench -- preview`: how fast the editor's preview follows a slider (issue 14). Per template:
 * - draft p95: a draft build (what the worker builds while a slider is held) per slider move, with the worker's
 *   sub-solid cache, over moves of the entry-hole slider (its shell is reused) and of a body slider (it is not);
 * - full p95: the full build on release at each of those values, with the same cache;
 * - the kernel's share: time inside manifold-3d calls over the whole build (parameter check, build, mesh, check,
 *   hash);
 * - the ratio of each p95 to a fixed calibration workload (manifold-3d boolean + a typed-array sort, independent of
 *   the templates) measured in the same run, so a slow or busy machine does not hide a regression;
 * - in Chromium (bench/previewBrowser.ts): slider input to the frame that shows the new mesh in the real editor,
 *   p50/p95 over 50 moves, and long tasks during a 5 s drag (software WebGL: --disable-gpu).
 * `-- preview --json` prints one JSON object (per template draftP95Ms, fullP95Ms, browserP95Ms, longTasks; and
 * calibrationMs); the text goes to stderr then. `--no-browser` skips the Chromium part.
 * Targets (p95, quiet machine): gable box and A-frame draft ≤ 8 ms, full ≤ 25 ms; round pod ≤ 16 / 40 ms; bark
 * trunk ≤ 30 / 80 ms; no long tasks. The load average is printed beside the figures: the machine is shared.
 */
import { loadavg } from 'node:os';
import Module from 'manifold-3d';
import { generate, generateDraft, SolidCache } from '../templates/index';
import { kernelTimeMs } from '../templates/lib/kernelClock';
import { measureBrowserPreview, type BrowserFigures } from './previewBrowser';

const json = process.argv.includes('--json');
const skipBrowser = process.argv.includes('--no-browser');
const log = (line: string): void => (json ? console.error(line) : console.log(line));

/** Targets from issue 14, p95 in ms. */
const TARGETS: Record<string, { draft: number; full: number }> = {
  'gable-box': { draft: 8, full: 25 },
  'a-frame': { draft: 8, full: 25 },
  'round-pod': { draft: 16, full: 40 },
  'bark-trunk': { draft: 30, full: 80 },
};

/** Per template: a body slider whose moves change the shell (no reuse), with values the defaults allow. */
const BODY_SLIDER: Record<string, { key: string; values: number[] }> = {
  'gable-box': { key: 'floorDepthMm', values: [112, 114, 116, 118, 120, 122, 124, 126, 128, 130] },
  'a-frame': { key: 'floorDepthMm', values: [112, 114, 116, 118, 120, 122, 124, 126, 128, 130] },
  'round-pod': { key: 'floorDiameterMm', values: [100, 102, 104, 106, 108, 110, 112, 114, 116, 118] },
  'bark-trunk': { key: 'barkSeed', values: [7, 8, 9, 10, 11, 12, 13, 14, 15, 16] },
};
const ENTRY_VALUES = [30, 30.5, 31, 31.5, 32, 32.5, 33, 33.5, 34, 34.5];
const ROUNDS = 2;

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

function loadText(): string {
  return loadavg()
    .map((v) => v.toFixed(2))
    .join(' / ');
}

const kernel = await Module();
kernel.setup();

/**
 * The fixed calibration workload: a sphere (96 segments) less a cube in manifold-3d, read back as a mesh, then a
 * sort of 200 000 pseudo-random doubles. It does not use the templates, so it stays the same when they change.
 */
function calibrationOnce(): number {
  const started = performance.now();
  const sphere = kernel.Manifold.sphere(50, 96);
  const cube = kernel.Manifold.cube([60, 60, 60], false);
  const cut = sphere.subtract(cube);
  const triangles = cut.getMesh().triVerts.length;
  for (const m of [sphere, cube, cut]) m.delete();
  const values = new Float64Array(200_000);
  let seed = 12345;
  for (let i = 0; i < values.length; i++) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    values[i] = seed / 4294967296;
  }
  values.sort();
  if (triangles === 0 || values[0] > values[1]) throw new Error('calibration workload went wrong');
  return performance.now() - started;
}

interface Timed {
  wallMs: number;
  /** This thread's CPU time: steadier than wall time when other work competes for the cores. */
  cpuMs: number;
  kernelMs: number;
}

async function timed(body: () => Promise<unknown>): Promise<Timed> {
  const kernelBefore = kernelTimeMs();
  const cpuBefore = process.cpuUsage();
  const started = performance.now();
  await body();
  const wallMs = performance.now() - started;
  const cpu = process.cpuUsage(cpuBefore);
  return { wallMs, cpuMs: (cpu.user + cpu.system) / 1000, kernelMs: kernelTimeMs() - kernelBefore };
}

interface TemplateFigures {
  draftP95Ms: number;
  fullP95Ms: number;
  draftP50Ms: number;
  fullP50Ms: number;
  draftCpuP95Ms: number;
  fullCpuP95Ms: number;
  draftKernelShare: number;
  fullKernelShare: number;
  draftTriangles: number;
  fullTriangles: number;
  browserP50Ms: number | null;
  browserP95Ms: number | null;
  browserReleaseP95Ms: number | null;
  /** Release to the full frame on screen (after its read-back), p95. */
  browserReleaseScreenP95Ms: number | null;
  longTasks: number | null;
  loadAverage: string;
}

function share(runs: Timed[]): number {
  const wall = runs.reduce((n, r) => n + r.wallMs, 0);
  return wall > 0 ? runs.reduce((n, r) => n + r.kernelMs, 0) / wall : 0;
}

async function measureTemplate(id: string, calibrations: number[]): Promise<TemplateFigures> {
  const cache = new SolidCache();
  // Warm up (kernel, template code) and fill the cache at the defaults, as the editor does on opening.
  const first = await generate(id, {}, { cache });
  const firstDraft = await generateDraft(id, {}, { cache });
  for (let i = 0; i < 2; i++) await generateDraft(id, { entryHoleDiameterMm: 31 }, { cache });
  const draft: Timed[] = [];
  const full: Timed[] = [];
  const bySlider: Record<string, { draft: number[]; full: number[] }> = {};
  const body = BODY_SLIDER[id];
  for (let round = 0; round < ROUNDS; round++) {
    for (const slider of [{ key: 'entryHoleDiameterMm', values: ENTRY_VALUES }, body]) {
      const mine = (bySlider[slider.key] ??= { draft: [], full: [] });
      calibrations.push(calibrationOnce());
      // A drag: draft builds at each value while the slider is held ...
      for (const value of slider.values) {
        const run = await timed(() => generateDraft(id, { [slider.key]: value }, { cache }));
        draft.push(run);
        mine.draft.push(run.wallMs);
      }
      // ... and the full build a release at each of those values would start (with what the drag left cached).
      for (const value of slider.values) {
        const run = await timed(() => generate(id, { [slider.key]: value }, { cache }));
        full.push(run);
        mine.full.push(run.wallMs);
      }
    }
  }
  cache.clear();
  const t = TARGETS[id];
  const wall = (runs: Timed[]): number[] => runs.map((r) => r.wallMs);
  const cpu = (runs: Timed[]): number[] => runs.map((r) => r.cpuMs);
  const figures: TemplateFigures = {
    draftP95Ms: percentile(wall(draft), 95),
    fullP95Ms: percentile(wall(full), 95),
    draftP50Ms: percentile(wall(draft), 50),
    fullP50Ms: percentile(wall(full), 50),
    draftCpuP95Ms: percentile(cpu(draft), 95),
    fullCpuP95Ms: percentile(cpu(full), 95),
    draftKernelShare: share(draft),
    fullKernelShare: share(full),
    draftTriangles: firstDraft.triangles,
    fullTriangles: first.triangles,
    browserP50Ms: null,
    browserP95Ms: null,
    browserReleaseP95Ms: null,
    browserReleaseScreenP95Ms: null,
    longTasks: null,
    loadAverage: loadText(),
  };
  log(
    `${id} v${first.template.version}: full ${first.triangles} triangles, draft ${firstDraft.triangles}; load ${figures.loadAverage}`,
  );
  const f = (v: number): string => v.toFixed(1).padStart(6);
  log(
    `  draft p50 ${f(figures.draftP50Ms)} p95 ${f(figures.draftP95Ms)} ms (target ≤ ${t.draft}), cpu p95 ${f(figures.draftCpuP95Ms)} ms, kernel ${(figures.draftKernelShare * 100).toFixed(0)} % of the build`,
  );
  log(
    `  full  p50 ${f(figures.fullP50Ms)} p95 ${f(figures.fullP95Ms)} ms (target ≤ ${t.full}), cpu p95 ${f(figures.fullCpuP95Ms)} ms, kernel ${(figures.fullKernelShare * 100).toFixed(0)} % of the build`,
  );
  for (const [key, runs] of Object.entries(bySlider)) {
    log(
      `    ${key.padEnd(20)} draft p95 ${f(percentile(runs.draft, 95))} ms, full p95 ${f(percentile(runs.full, 95))} ms`,
    );
  }
  return figures;
}

/** Prints the preview figures (text, or one JSON object with --json). */
export default async function bench(): Promise<void> {
  log(`load average at start: ${loadText()} (1/5/15 min)`);
  const calibrations: number[] = [];
  for (let i = 0; i < 3; i++) calibrations.push(calibrationOnce()); // warm-up, not counted
  calibrations.length = 0;
  const templates: Record<string, TemplateFigures> = {};
  for (const id of Object.keys(TARGETS)) templates[id] = await measureTemplate(id, calibrations);
  for (let i = 0; i < 4; i++) calibrations.push(calibrationOnce());
  const calibrationMs = percentile(calibrations, 50);
  log(`calibration workload: p50 ${calibrationMs.toFixed(1)} ms over ${calibrations.length} runs in this run`);
  for (const [id, t] of Object.entries(templates)) {
    log(
      `  ${id.padEnd(11)} draft p95 / calibration ${(t.draftP95Ms / calibrationMs).toFixed(2)}, full p95 / calibration ${(t.fullP95Ms / calibrationMs).toFixed(2)}`,
    );
  }

  let browser: BrowserFigures | null = null;
  let browserProblem: string | null = skipBrowser ? 'skipped (--no-browser)' : null;
  if (!skipBrowser) {
    try {
      browser = await measureBrowserPreview(Object.keys(TARGETS), log);
    } catch (err) {
      browserProblem = err instanceof Error ? err.message : String(err);
      log(`Chromium part failed: ${browserProblem}`);
    }
  }
  if (browser) {
    for (const [id, b] of Object.entries(browser.templates)) {
      const t = templates[id];
      if (!t) continue;
      t.browserP50Ms = b.p50Ms;
      t.browserP95Ms = b.p95Ms;
      t.browserReleaseP95Ms = b.releaseP95Ms;
      t.browserReleaseScreenP95Ms = b.releaseScreenP95Ms;
      t.longTasks = b.longTasks;
    }
  }
  log(`load average at end: ${loadText()}`);
  if (json) {
    console.log(
      JSON.stringify({
        calibrationMs,
        loadAverageStart: templates[Object.keys(templates)[0]]?.loadAverage ?? null,
        loadAverageEnd: loadText(),
        webgl: browser ? browser.renderer : null,
        browserProblem,
        templates,
      }),
    );
  }
}
