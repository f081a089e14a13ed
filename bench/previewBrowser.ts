/**
 * The Chromium part of `npm run bench -- preview`: drives the real editor (client built as for the browser tests,
 * real server on an in-memory seeded database, Debian's Chromium through playwright-core) and reads the measures the
 * page records from a slider input to the frame that shows the new mesh (`nw-preview-draft` while the slider is held,
 * `nw-preview-full` from its release). Per template: p50/p95 over 50 moves of the entry-hole slider while held; p50
 * and p95 of five releases, with the mesh's arrival on the page (build and transfer) and the drawn frame's arrival
 * on the screen (`…-arrival`, `…-screen` measures); and the long tasks (over 50 ms, PerformanceObserver 'longtask')
 * on the page's main thread during a 5 s drag. Chromium runs with --disable-gpu, so WebGL is software-rendered: the renderer string is reported.
 */
import type { Page } from 'playwright-core';
import { startE2E } from '../tests/e2e/harness';

/** What the browser measured for one template. */
export interface BrowserTemplateFigures {
  /** Moves whose new mesh was drawn (moves that did not change the value are not counted). */
  moves: number;
  p50Ms: number | null;
  p95Ms: number | null;
  /** Drafts: input to the frame on screen (after its read-back). */
  screenP95Ms: number | null;
  releaseP50Ms: number | null;
  releaseP95Ms: number | null;
  /** Releases: to the full mesh on the page (its build and transfer), p95. */
  releaseArrivalP95Ms: number | null;
  /** Releases: to the frame on screen, p50 and p95. */
  releaseScreenP50Ms: number | null;
  releaseScreenP95Ms: number | null;
  longTasks: number;
}

/** What the browser measured, with the WebGL renderer it used. */
export interface BrowserFigures {
  renderer: string;
  templates: Record<string, BrowserTemplateFigures>;
}

const MOVES = 50;
const RELEASES = 5;
const DRAG_MS = 5_000;
const SLIDER = 'entryHoleDiameterMm';

function percentile(values: number[], p: number): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

async function measureCount(page: Page, name: string): Promise<number> {
  return page.evaluate((n) => performance.getEntriesByName(n, 'measure').length, name);
}

/** Waits until the page has recorded more than `count` measures called `name`; false after the timeout. */
async function waitForMeasure(page: Page, name: string, count: number, timeoutMs = 4_000): Promise<boolean> {
  try {
    await page.waitForFunction(
      ([n, c]) => performance.getEntriesByName(n as string, 'measure').length > (c as number),
      [name, count] as const,
      { timeout: timeoutMs, polling: 'raf' },
    );
    return true;
  } catch {
    return false;
  }
}

async function durations(page: Page, name: string): Promise<number[]> {
  return page.evaluate((n) => performance.getEntriesByName(n, 'measure').map((e) => e.duration), name);
}

/** Centre of the slider handle and the pixels per slider step. */
async function sliderGeometry(
  page: Page,
): Promise<{ x: number; y: number; stepPx: number; left: number; right: number }> {
  const row = page.getByTestId(`param-${SLIDER}`);
  const handle = row.locator('.n-slider-handle').first();
  const rail = row.locator('.n-slider-rail').first();
  const h = await handle.boundingBox();
  const r = await rail.boundingBox();
  if (!h || !r) throw new Error('the entry-hole slider is not on screen');
  const [min, max] = await Promise.all([
    row.locator('[role="slider"]').first().getAttribute('aria-valuemin'),
    row.locator('[role="slider"]').first().getAttribute('aria-valuemax'),
  ]);
  const steps = min && max ? (Number(max) - Number(min)) / 0.5 : 80;
  return {
    x: h.x + h.width / 2,
    y: h.y + h.height / 2,
    stepPx: r.width / steps,
    left: r.x + 4,
    right: r.x + r.width - 4,
  };
}

async function measureTemplate(page: Page, baseUrl: string, id: string): Promise<BrowserTemplateFigures> {
  await page.goto(`${baseUrl}/designs/new/${id}`);
  await page.getByTestId('model-canvas').waitFor();
  // The first full build and its figures.
  await page.waitForFunction(() => !document.querySelector('[data-testid="geometry-status"] .n-spin-body'), null, {
    timeout: 30_000,
  });
  await page.waitForTimeout(500);
  // The opening build is not a slider move.
  await page.evaluate(() => performance.clearMeasures());
  const slider = await sliderGeometry(page);
  const dx = Math.max(2, Math.ceil(slider.stepPx * 1.5));

  // 50 moves while held: each move waits for the frame that shows its draft.
  await page.mouse.move(slider.x, slider.y);
  await page.mouse.down();
  let x = slider.x;
  let direction = 1;
  for (let i = 0; i < MOVES; i++) {
    if (x + direction * dx > slider.right || x + direction * dx < slider.left) direction = -direction;
    x += direction * dx;
    const before = await measureCount(page, 'nw-preview-draft');
    await page.mouse.move(x, slider.y);
    await waitForMeasure(page, 'nw-preview-draft', before);
  }
  const fullBefore = await measureCount(page, 'nw-preview-full-screen');
  await page.mouse.up();
  await waitForMeasure(page, 'nw-preview-full-screen', fullBefore, 10_000);
  const drafts = await durations(page, 'nw-preview-draft');
  const draftsOnScreen = await durations(page, 'nw-preview-draft-screen');

  // Releases: a short drag, then the full build on release.
  for (let i = 0; i < RELEASES - 1; i++) {
    const handle = await sliderGeometry(page);
    await page.mouse.move(handle.x, handle.y);
    await page.mouse.down();
    await page.mouse.move(handle.x + (i % 2 ? -dx : dx), handle.y);
    const before = await measureCount(page, 'nw-preview-full-screen');
    await page.mouse.up();
    await waitForMeasure(page, 'nw-preview-full-screen', before, 10_000);
  }
  const releases = await durations(page, 'nw-preview-full');
  const releaseArrivals = await durations(page, 'nw-preview-full-arrival');
  const releasesOnScreen = await durations(page, 'nw-preview-full-screen');

  // Long tasks during a 5 s drag (a move every frame or so, without waiting for the preview).
  await page.evaluate(() => {
    const w = window as unknown as { __nwLongTasks: number; __nwObserver?: PerformanceObserver };
    w.__nwLongTasks = 0;
    w.__nwObserver?.disconnect();
    w.__nwObserver = new PerformanceObserver((list) => {
      w.__nwLongTasks += list.getEntries().filter((e) => e.duration > 50).length;
    });
    w.__nwObserver.observe({ type: 'longtask' });
  });
  const start = await sliderGeometry(page);
  await page.mouse.move(start.x, start.y);
  await page.mouse.down();
  const began = Date.now();
  let at = start.x;
  let way = 1;
  while (Date.now() - began < DRAG_MS) {
    if (at + way * dx > start.right || at + way * dx < start.left) way = -way;
    at += way * dx;
    await page.mouse.move(at, start.y);
    await page.waitForTimeout(16);
  }
  await page.mouse.up();
  await page.waitForTimeout(1_500);
  const longTasks = await page.evaluate(() => (window as unknown as { __nwLongTasks: number }).__nwLongTasks);
  await page.evaluate(() => performance.clearMeasures());
  return {
    moves: drafts.length,
    p50Ms: percentile(drafts, 50),
    p95Ms: percentile(drafts, 95),
    screenP95Ms: percentile(draftsOnScreen, 95),
    releaseP50Ms: percentile(releases, 50),
    releaseP95Ms: percentile(releases, 95),
    releaseArrivalP95Ms: percentile(releaseArrivals, 95),
    releaseScreenP50Ms: percentile(releasesOnScreen, 50),
    releaseScreenP95Ms: percentile(releasesOnScreen, 95),
    longTasks,
  };
}

/**
 * Measures the preview in Chromium for each template and prints a line per template.
 * @param templateIds - templates to open in the editor
 * @param log - where the text goes
 */
export async function measureBrowserPreview(
  templateIds: string[],
  log: (line: string) => void,
): Promise<BrowserFigures> {
  log('Chromium: building the client if needed and starting the server…');
  const e2e = await startE2E({ viewport: { width: 1440, height: 900 } });
  try {
    const page = await e2e.newPage({ viewport: { width: 1440, height: 900 } });
    page.setDefaultTimeout(30_000);
    await e2e.signInAs(page, 'designer');
    const renderer = await page.evaluate(() => {
      const gl = document.createElement('canvas').getContext('webgl');
      if (!gl) return 'no WebGL';
      const info = gl.getExtension('WEBGL_debug_renderer_info');
      return String(info ? gl.getParameter(info.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER));
    });
    log(`Chromium WebGL renderer: ${renderer} (software rendering: --disable-gpu)`);
    const templates: Record<string, BrowserTemplateFigures> = {};
    for (const id of templateIds) {
      const figures = await measureTemplate(page, e2e.baseUrl, id);
      templates[id] = figures;
      const f = (v: number | null): string => (v === null ? '   n/a' : v.toFixed(1).padStart(6));
      log(
        `  ${id.padEnd(11)} input→frame (draft, held) p50 ${f(figures.p50Ms)} p95 ${f(figures.p95Ms)} ms over ${figures.moves} moves (on screen p95 ${f(figures.screenP95Ms)}); long tasks in a 5 s drag: ${figures.longTasks}`,
      );
      log(
        `  ${''.padEnd(11)} release→full mesh on the page p95 ${f(figures.releaseArrivalP95Ms)}; →frame drawn p50 ${f(figures.releaseP50Ms)} p95 ${f(figures.releaseP95Ms)}; →on screen p50 ${f(figures.releaseScreenP50Ms)} p95 ${f(figures.releaseScreenP95Ms)} ms`,
      );
      const problems = e2e.problems(page);
      if (problems.length > 0) log(`    page problems: ${problems.slice(0, 3).join(' | ')}`);
    }
    return { renderer, templates };
  } finally {
    await e2e.close();
  }
}
