/**
 * The family page in Chromium, against the real server: variant rows fill in as each result arrives during a
 * computation (not only at the end), and a sample photo opens in an enlarged view that has an accessible name and
 * closes with Esc. These are the product's own interaction rules (common practice, no outside source).
 */
import { mkdirSync } from 'node:fs';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 960 } });
}, 240_000);

afterAll(async () => {
  await e2e?.close();
});

/** Creates a draft family through the API as the signed-in designer of `page`; returns its id. */
async function createFamily(page: Page, code: string, holesMm: number[]): Promise<string> {
  const answer = await page.request.post('/api/families', {
    headers: { Origin: e2e.baseUrl },
    data: {
      code,
      name: `Browser family ${code}`,
      templateId: 'gable-box',
      axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: holesMm }],
      supportBudgetMm3: 20_000,
    },
  });
  expect(answer.status(), await answer.text()).toBe(201);
  return ((await answer.json()) as { family: { id: string } }).family.id;
}

describe('the family page', () => {
  it('fills in each variant row as its result arrives, while the computation still runs', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    // Twelve entry holes, 24 to 46 mm: long enough a run that the first rows are in well before the last.
    const holes = Array.from({ length: 12 }, (_, i) => 24 + 2 * i);
    const id = await createFamily(page, 'ROWS', holes);
    await page.goto(`/families/${id}`);
    await page.locator('tr[data-computed="no"]').first().waitFor();
    await page.getByTestId('start-compute').click();
    // A row shows its result while the progress panel still says the run is going and not every variant is done.
    const seenWhileRunning = await page.waitForFunction(
      () => {
        const panel = document.querySelector('[data-testid="compute-panel"]');
        const computedRows = document.querySelectorAll('tr[data-computed="yes"]').length;
        const count = /(\d+) \/ (\d+)/.exec(document.querySelector('[data-testid="compute-count"]')?.textContent ?? '');
        if (computedRows === 0) return null;
        return {
          state: panel?.getAttribute('data-state'),
          computedRows,
          done: count ? Number(count[1]) : -1,
          total: count ? Number(count[2]) : -1,
        };
      },
      undefined,
      { timeout: 120_000 },
    );
    const seen = (await seenWhileRunning.jsonValue()) as { state: string; computedRows: number; done: number };
    await page.screenshot({ path: `${SHOTS}/family-rows-filling.png`, fullPage: true });
    expect(seen.state).toBe('running');
    expect(seen.done).toBeLessThan(holes.length);
    expect(seen.computedRows).toBeGreaterThan(0);
    // At the end every row on the page has its result.
    await page.waitForFunction(
      () => document.querySelector('[data-testid="compute-panel"]')?.getAttribute('data-state') === 'done',
      undefined,
      { timeout: 150_000 },
    );
    await page.waitForFunction(() => document.querySelectorAll('tr[data-computed="no"]').length === 0);
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 300_000);

  it('a sample photo opens enlarged, named for assistive tools, and Esc closes it', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    const id = await createFamily(page, 'FOTO', [28]);
    const png = await sharp({
      create: { width: 640, height: 480, channels: 3, background: { r: 138, g: 102, b: 73 } },
    })
      .png()
      .toBuffer();
    const upload = await page.request.post(`/api/families/${id}/photos`, {
      headers: { Origin: e2e.baseUrl },
      multipart: {
        photo: { name: 'sample.png', mimeType: 'image/png', buffer: png },
        caption: 'First sample, bark brown',
      },
    });
    expect(upload.status(), await upload.text()).toBe(201);

    await page.goto(`/families/${id}`);
    const open = page.getByRole('button', { name: 'Enlarge the photo “First sample, bark brown”' });
    await open.click();
    const dialog = page.getByRole('dialog', { name: /Sample print photo 1 of 1: First sample, bark brown/ });
    await dialog.waitFor();
    await expect(dialog.locator('img').getAttribute('src')).resolves.toMatch(/^\/api\/|^\//);
    await page.screenshot({ path: `${SHOTS}/family-photo-enlarged.png` });
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'detached' });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 120_000);
});
