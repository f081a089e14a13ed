/**
 * Variant families in Chromium, end to end through the real server: a designer builds a family of six variants
 * (entry hole 28 / 32 mm × three colours), computes it and waits for the progress bar to finish, acknowledges any
 * bird-fit warnings in writing, uploads a photo of a sample print and submits; a catalogue manager finds it in the
 * review queue, approves and publishes it; sales finds its variants in the catalogue; a designer who tries to
 * publish through the API gets 403 and never sees a publish button. Screenshots go to /tmp/nestwright-e2e.
 *
 * The workflow rules checked here (who may publish, which state allows what) are the product's own decisions
 * (PRODUCT.md roles, issue 5): no outside source. Entry holes of 28 and 32 mm are common small-cavity sizes
 * (source: RSPB — 25 mm blue tit, 28 mm great tit, 32 mm house sparrow).
 */
import { mkdirSync } from 'node:fs';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { demoPerson, startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
const CODE = 'HTE';
const FAMILY_NAME = 'Hedgerow browser-test family';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 960 } });
}, 240_000);

afterAll(async () => {
  await e2e?.close();
});

/** A small PNG of a "sample print": a bark-brown box shape on an eggshell ground, made with sharp. */
async function samplePhotoPng(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="320" height="240">
    <rect width="320" height="240" fill="#f5f0e4"/>
    <polygon points="100,90 160,40 220,90" fill="#6a4a32"/>
    <rect x="110" y="90" width="100" height="120" fill="#8a6649"/>
    <circle cx="160" cy="130" r="14" fill="#25231e"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

/** Text of an element found by test id, trimmed. */
async function textOf(page: Page, testId: string): Promise<string> {
  return ((await page.getByTestId(testId).first().textContent()) ?? '').trim();
}

/** JSON body of an API answer, failing the test with the server's message when the status is not the wanted one. */
async function expectJson<T>(answer: import('playwright-core').APIResponse, status: number): Promise<T> {
  expect(answer.status(), await answer.text()).toBe(status);
  return (await answer.json()) as T;
}

interface FamilyAnswer {
  family: {
    id: string;
    state: string;
    revision: number;
    compute: { state: string };
    gate: { ok: boolean; warnings: { code: string; acknowledgement: unknown }[] };
  };
}

/**
 * Creates, computes, acknowledges and submits a small family through the API as the signed-in designer of `page`
 * (the browser test of the screens is above; this only prepares a family in review for the send-back check).
 */
async function submitFamilyThroughApi(page: Page, code: string, name: string): Promise<string> {
  const headers = { Origin: e2e.baseUrl };
  const created = await expectJson<FamilyAnswer>(
    await page.request.post('/api/families', {
      headers,
      data: {
        code,
        name,
        templateId: 'gable-box',
        axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] }],
        supportBudgetMm3: 20_000,
      },
    }),
    201,
  );
  const id = created.family.id;
  await expectJson(await page.request.post(`/api/families/${id}/compute`, { headers, data: {} }), 202);
  let family = created.family;
  for (let tries = 0; tries < 240 && family.compute.state !== 'done'; tries++) {
    await new Promise((resolve) => setTimeout(resolve, 500));
    family = (await expectJson<FamilyAnswer>(await page.request.get(`/api/families/${id}`), 200)).family;
    expect(['queued', 'running', 'done']).toContain(family.compute.state);
  }
  const open = family.gate.warnings.filter((w) => !w.acknowledgement);
  if (open.length) {
    await expectJson(
      await page.request.post(`/api/families/${id}/acknowledgements`, {
        headers,
        data: {
          acknowledgements: open.map((w) => ({
            code: w.code,
            text: 'Accepted for this test family; the listing carries the caution.',
          })),
        },
      }),
      200,
    );
  }
  await expectJson(await page.request.post(`/api/families/${id}/submit`, { headers, data: {} }), 200);
  return id;
}

describe('variant families: build, review, publish, catalogue', () => {
  let familyId = '';

  it('a designer builds a six-variant family, computes it, adds a photo and submits it', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto('/families');
    await page.getByTestId('new-family').waitFor();
    await page.waitForFunction(() => !document.querySelector('.n-data-table .n-base-loading'));
    await page.screenshot({ path: `${SHOTS}/families-list.png`, fullPage: true });
    await page.getByTestId('new-family').click();
    await page.waitForURL('**/families/new');

    await page.locator('#family-name').fill(FAMILY_NAME);
    await page.locator('#family-code').fill(CODE);

    // Parameter axis: entry hole 28 and 32 mm, typed and added as chips.
    await page.getByTestId('add-param-axis').click();
    const entryAxis = page.getByTestId('axis-entryHoleDiameterMm');
    await expect(entryAxis.count()).resolves.toBe(1);
    for (const mm of [28, 32]) {
      await page.locator('#axis-input-entryHoleDiameterMm').fill(String(mm));
      await page.getByTestId('axis-add-entryHoleDiameterMm').click();
      await page.getByTestId(`axis-value-entryHoleDiameterMm-${mm}`).waitFor();
    }
    // A value outside the template's range is refused on the spot with the range in the message.
    await page.locator('#axis-input-entryHoleDiameterMm').fill('500');
    await page.getByTestId('axis-add-entryHoleDiameterMm').click();
    await expect(entryAxis.getByRole('alert').textContent()).resolves.toMatch(/above the highest/);
    await page.locator('#axis-input-entryHoleDiameterMm').fill('');

    // Colour axis: three colours -> 2 × 3 = 6 variants.
    await page.getByTestId('add-colour-axis').click();
    for (const colour of ['sand', 'moss-green', 'white']) await page.getByTestId(`colour-${colour}`).click();
    await expect(textOf(page, 'variant-count')).resolves.toMatch(/^6\s*variants/);
    await expect(textOf(page, 'variant-count')).resolves.toContain(`FH-${CODE}-28-SAND`);

    // Support budget 20 cm³ per variant: above what these variants need (a few cm³ in the engine's estimate), so the
    // gate can open; common practice, no source.
    await page.locator('#support-budget').fill('20');
    await page.locator('#support-budget').blur();
    await page.screenshot({ path: `${SHOTS}/family-editor.png`, fullPage: true });

    await page.getByTestId('save-family').click();
    await page
      .waitForURL((url) => /^\/families\/[^/]+$/.test(url.pathname) && !url.pathname.endsWith('/new'), {
        timeout: 15_000,
      })
      .catch(async (err: unknown) => {
        await page.screenshot({ path: `${SHOTS}/family-save-failed.png`, fullPage: true });
        const shown = (await page.getByTestId('save-error').count())
          ? await textOf(page, 'save-error')
          : 'no error shown';
        throw new Error(`the family was not saved: ${shown} (${String(err)})`);
      });
    familyId = new URL(page.url()).pathname.split('/').pop()!;
    expect(familyId).not.toBe('new');

    // Compute: the progress bar runs to 6 / 6 through the server-sent events.
    await page.getByTestId('start-compute').click();
    await page.waitForFunction(
      () =>
        document.querySelector('[data-testid="compute-panel"]')?.getAttribute('data-state') === 'running' ||
        document.querySelector('[data-testid="compute-panel"]')?.getAttribute('data-state') === 'done',
      undefined,
      { timeout: 20_000 },
    );
    await page.screenshot({ path: `${SHOTS}/family-computing.png`, fullPage: true });
    await page.waitForFunction(
      () => document.querySelector('[data-testid="compute-panel"]')?.getAttribute('data-state') === 'done',
      undefined,
      { timeout: 150_000 },
    );
    await expect(textOf(page, 'compute-count')).resolves.toBe('6 / 6 variants');
    await expect(page.getByTestId('compute-progress').getAttribute('aria-valuenow')).resolves.toBe('6');

    // The matrix lists the six SKUs of the scheme FH-<code>-<hole>-<colour>.
    const skus = page.getByTestId('variant-sku');
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="variant-sku"]').length === 6, undefined, {
      timeout: 15_000,
    });
    const skuTexts = (await skus.allTextContents()).map((s) => s.trim()).sort();
    expect(skuTexts).toEqual(
      ['28', '32'].flatMap((mm) => ['MOSS', 'SAND', 'WHIT'].map((c) => `FH-${CODE}-${mm}-${c}`)).sort(),
    );

    // Bird-fit warnings that need it are acknowledged in writing, one text per warning. The rows update per variant
    // while the family itself reloads after the last one: wait until the gate no longer says "not computed".
    await page.waitForFunction(
      () =>
        !document.querySelector('[data-testid="gate-blockers"] [data-code="not_computed"]') &&
        !!document.querySelector('[data-testid="gate-panel"]'),
      undefined,
      { timeout: 15_000 },
    );
    const acks = page.locator('textarea[id^="ack-"]');
    const ackCount = await acks.count();
    for (let i = 0; i < ackCount; i++) {
      await acks
        .nth(i)
        .fill(
          'Sold with a printed note: mount 2–4 m high, no perch, clean out each autumn; checked with the studio ecologist.',
        );
    }
    if (ackCount) {
      await page.getByTestId('save-acks').click();
      await page.waitForFunction(
        () =>
          !document
            .querySelector('[data-testid="save-acks"]')
            ?.closest('button')
            ?.classList.contains('n-button--loading'),
      );
    }
    await page
      .waitForFunction(
        () => document.querySelector('[data-testid="gate-panel"]')?.getAttribute('data-ok') === 'true',
        undefined,
        {
          timeout: 15_000,
        },
      )
      .catch(async (err: unknown) => {
        throw new Error(`gate stays blocked: ${await textOf(page, 'gate-panel')} (${String(err)})`);
      });

    // A text file named like a PNG is refused by its content, and the page says so.
    const fileInput = page.getByTestId('photo-gallery').locator('input[type="file"]');
    await fileInput.setInputFiles({
      name: 'not-a-photo.png',
      mimeType: 'image/png',
      buffer: Buffer.from('just some words, no pixels'),
    });
    await page.getByTestId('photo-error').waitFor();
    await expect(textOf(page, 'photo-error')).resolves.toContain('not-a-photo.png');
    expect(await page.getByTestId('photo').count()).toBe(0);

    // Photo of a sample print: uploaded through the upload area, thumbnail shown from the server.
    const png = await samplePhotoPng();
    await page.getByTestId('photo-gallery').locator('input[type="file"]').setInputFiles({
      name: 'sample-print.png',
      mimeType: 'image/png',
      buffer: png,
    });
    const thumb = page.getByTestId('photo').first().locator('img');
    await thumb.waitFor({ timeout: 20_000 });
    await page.waitForFunction(() => {
      const img = document.querySelector('[data-testid="photo"] img') as HTMLImageElement | null;
      return !!img && img.complete && img.naturalWidth > 0;
    });

    // A designer never sees the catalogue manager's buttons.
    expect(await page.getByTestId('action-publish').count()).toBe(0);
    expect(await page.getByTestId('action-approve').count()).toBe(0);

    await page.getByTestId('action-submit').click();
    // Submitting asks for an optional note, kept in the history.
    await page.locator('#step-note').fill('Ready for the spring list.');
    await page.getByTestId('confirm-step').click();
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('In review'),
    );
    await page.screenshot({ path: `${SHOTS}/family-submitted.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 240_000);

  it('a catalogue manager finds it in the review queue, approves and publishes it', async () => {
    expect(familyId).not.toBe('');
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'catalogue_manager');
    await page.goto('/review');
    const card = page.getByTestId('queue-in_review').getByTestId(`review-${CODE}`);
    await card.waitFor();
    await expect(card.textContent()).resolves.toContain(FAMILY_NAME);
    await page.screenshot({ path: `${SHOTS}/review-queue.png`, fullPage: true });
    await card.click();
    await page.waitForURL(`**/review/${familyId}`);

    // Every variant's report is open, and the designer's photo is there.
    await page.waitForFunction(
      () => document.querySelectorAll('[data-testid^="variant-report-"]').length === 6,
      undefined,
      { timeout: 15_000 },
    );
    await page.getByTestId('photo').first().locator('img').waitFor();
    expect(await page.getByTestId('action-submit').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/review-family.png`, fullPage: true });

    await page.getByTestId('action-approve').click();
    await page.locator('#step-note').fill('Photos are clear; approved for the spring list.');
    await page.getByTestId('confirm-step').click();
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Approved'),
    );
    // The note is shown with the family.
    await page.getByTestId('review-comments').getByText('Photos are clear; approved for the spring list.').waitFor();
    await page.getByTestId('action-publish').click();
    await page.getByTestId('confirm-step').click();
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Published'),
    );
    await page.screenshot({ path: `${SHOTS}/review-published.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 120_000);

  it('sales finds the published variants in the catalogue', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'sales');
    await page.goto('/catalogue');
    await page.locator('#catalogue-search').fill(CODE);
    await page.waitForFunction(
      (code) => {
        const skus = [...document.querySelectorAll('[data-testid="catalogue-sku"]')].map((el) => el.textContent ?? '');
        return skus.length === 6 && skus.every((sku) => sku.startsWith(`FH-${code}-`));
      },
      CODE,
      { timeout: 15_000 },
    );
    const sku = `FH-${CODE}-32-MOSS`;
    const row = page.getByTestId(`catalogue-row-${sku}`);
    await expect(row.textContent()).resolves.toContain(FAMILY_NAME);
    // The row shows the price the catalogue API gives for that SKU, as money in its currency.
    const listed = await page.request.get(`/api/catalogue?q=${sku}`);
    expect(listed.status()).toBe(200);
    const { variants } = (await listed.json()) as { variants: { sku: string; priceCents: number; currency: string }[] };
    const variant = variants.find((item) => item.sku === sku)!;
    expect(variant.priceCents).toBeGreaterThan(0);
    const money = new Intl.NumberFormat('en', { style: 'currency', currency: variant.currency }).format(
      variant.priceCents / 100,
    );
    await expect(row.textContent()).resolves.toContain(money);
    await page.screenshot({ path: `${SHOTS}/catalogue.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);

  it('a designer who tries to publish through the API gets 403 and sees no publish button', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    const answer = await page.request.post(`/api/families/${familyId}/publish`, {
      data: {},
      headers: { Origin: e2e.baseUrl },
    });
    expect(answer.status()).toBe(403);
    await page.goto(`/families/${familyId}`);
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Published'),
    );
    expect(await page.getByTestId('action-publish').count()).toBe(0);
    expect(await page.getByTestId('action-retire').count()).toBe(0);
    // The review area is not the designer's: the router shows the forbidden page.
    await page.goto(`/review/${familyId}`);
    await page.waitForURL(/\/forbidden/);
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);
  it('editing the published family opens revision 2 as a draft; the diff names the change; the catalogue keeps revision 1', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto(`/families/${familyId}`);
    await page.getByTestId('edit-family').click();
    await page.waitForURL(`**/families/${familyId}/edit`);
    await page.locator('#axis-input-entryHoleDiameterMm').fill('25');
    await page.getByTestId('axis-add-entryHoleDiameterMm').click();
    await expect(textOf(page, 'variant-count')).resolves.toMatch(/^9\s*variants/);
    await page.getByTestId('save-family').click();
    await page.waitForURL((url) => url.pathname === `/families/${familyId}`);
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Draft'),
    );
    const diff = page.getByTestId('revision-diff');
    await page.waitForFunction(() =>
      /Variants: 6 → 9/.test(document.querySelector('[data-testid="revision-diff"]')?.textContent ?? ''),
    );
    await expect(diff.textContent()).resolves.toContain('+25');
    await page.screenshot({ path: `${SHOTS}/family-revision-2.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();

    // Sales still sees the six published variants of revision 1, none with the new 25 mm hole.
    const sales = await e2e.newPage();
    await e2e.signInAs(sales, 'sales');
    const listed = await expectJson<{ variants: { sku: string; revision: number }[] }>(
      await sales.request.get(`/api/catalogue?q=${CODE}`),
      200,
    );
    expect(listed.variants.map((v) => v.sku).filter((sku) => sku.startsWith(`FH-${CODE}-`))).toHaveLength(6);
    expect(listed.variants.every((v) => v.revision === 1)).toBe(true);
    await sales.context().close();
  }, 90_000);

  it('a catalogue manager can send a family back only with comments, and the designer reads them', async () => {
    const designer = await e2e.newPage();
    await e2e.signInAs(designer, 'designer');
    const returnedId = await submitFamilyThroughApi(designer, 'RET', 'Send-back test family');

    const page = await e2e.newPage();
    await e2e.signInAs(page, 'catalogue_manager');
    await page.goto(`/review/${returnedId}`);
    await page.getByTestId('action-return').click();
    // The send-back button stays disabled until comments are written.
    await expect(page.getByTestId('confirm-step').isDisabled()).resolves.toBe(true);
    const comments = 'Please add a drainage note to the listing and a photo of the 32 mm sample.';
    await page.locator('#step-note').fill(comments);
    await page.getByTestId('confirm-step').click();
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Draft'),
    );
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();

    await designer.goto(`/families/${returnedId}`);
    await designer.getByTestId('review-comments').waitFor();
    await expect(designer.getByTestId('review-comments').textContent()).resolves.toContain(comments);
    await designer.screenshot({ path: `${SHOTS}/family-sent-back.png`, fullPage: true });
    expect(e2e.problems(designer)).toEqual([]);
    await designer.context().close();
  }, 240_000);

  it('a new family can start from a saved preset: its parameters become the base parameters', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    const preset = await expectJson<{ id: string; name: string }>(
      await page.request.post('/api/presets', {
        headers: { Origin: e2e.baseUrl },
        // source: RSPB — 28 mm great tit
        data: { templateId: 'gable-box', name: 'Great tit, 28 mm', params: { entryHoleDiameterMm: 28 } },
      }),
      201,
    );
    await page.goto('/families/new');
    await page.getByTestId('family-preset').click();
    await page.locator('.n-base-select-option', { hasText: preset.name }).click();
    // The preset's name fills the empty family name, and its entry hole is the base value.
    await expect(page.locator('#family-name').inputValue()).resolves.toBe(preset.name);
    await page.getByRole('heading', { name: /Base parameters/ }).click();
    expect(Number(await page.locator('#input-entryHoleDiameterMm').inputValue())).toBeCloseTo(28, 6);
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);

  it('the editor refuses more than 500 variants with a message naming the count', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto('/families/new');
    await page.getByTestId('add-param-axis').click();
    // 11 entry holes × 10 values of a second parameter × 5 colours = 550 variants.
    for (let mm = 25; mm <= 45; mm += 2) {
      await page.locator('#axis-input-entryHoleDiameterMm').fill(String(mm));
      await page.getByTestId('axis-add-entryHoleDiameterMm').click();
    }
    await page.getByTestId('add-param-axis').click();
    const second = page.locator('[data-testid^="axis-"][aria-label^="Axis:"]').nth(1);
    const key = ((await second.getAttribute('data-testid')) ?? '').replace(/^axis-/, '');
    const input = page.locator(`#axis-input-${key}`);
    const [low] = ((await input.getAttribute('placeholder')) ?? '').split(/[–\s]/).map(Number);
    for (let i = 0; i < 10; i++) {
      await input.fill(String(low + i));
      await page.getByTestId(`axis-add-${key}`).click();
    }
    await page.getByTestId('add-colour-axis').click();
    for (const colour of ['white', 'sand', 'moss-green', 'bark-brown', 'black'])
      await page.getByTestId(`colour-${colour}`).click();
    await expect(textOf(page, 'variant-count')).resolves.toMatch(/^550\s*variants/);
    await expect(textOf(page, 'variant-limit')).resolves.toContain('at most 500 variants; these axes make 550');
    await expect(page.getByTestId('save-family').isDisabled()).resolves.toBe(true);
    await page.screenshot({ path: `${SHOTS}/family-too-many.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);

  it('an admin reads the captured e-mail that told reviewers about the submission', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'admin');
    const reviewer = demoPerson('catalogue_manager');
    // Mail goes out through the queue: look again for a while until the message has arrived.
    let found = false;
    for (let tries = 0; tries < 20 && !found; tries++) {
      await page.goto('/admin/mail');
      await page.getByRole('heading', { name: /Received/ }).waitFor();
      const texts = await page.getByTestId('mail-message').allTextContents();
      found = texts.some((text) => text.includes(FAMILY_NAME) && text.includes(reviewer.email));
      if (!found) await new Promise((resolve) => setTimeout(resolve, 500));
    }
    expect(found).toBe(true);
    await page.screenshot({ path: `${SHOTS}/admin-mail.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);
  it('a running computation can be cancelled from the progress panel', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    // 8 entry holes × 3 trims = 24 different meshes: long enough to cancel part-way.
    const created = await expectJson<FamilyAnswer>(
      await page.request.post('/api/families', {
        headers: { Origin: e2e.baseUrl },
        data: {
          code: 'CAN',
          name: 'Cancel test family',
          templateId: 'gable-box',
          axes: [
            { kind: 'param', key: 'entryHoleDiameterMm', values: [25, 26, 27, 28, 29, 30, 31, 32] },
            { kind: 'param', key: 'trimStyle', values: ['none', 'shingles', 'boards'] },
          ],
          supportBudgetMm3: 20_000,
        },
      }),
      201,
    );
    await page.goto(`/families/${created.family.id}`);
    await page.getByTestId('start-compute').click();
    await page.getByTestId('cancel-compute').click();
    await page.waitForFunction(
      () => document.querySelector('[data-testid="compute-panel"]')?.getAttribute('data-state') === 'cancelled',
      undefined,
      { timeout: 30_000 },
    );
    const [done, total] = (await textOf(page, 'compute-count')).split(/\D+/).filter(Boolean).map(Number);
    expect(total).toBe(24);
    expect(done).toBeLessThan(24);
    await expect(textOf(page, 'compute-state')).resolves.toMatch(/Cancelled/);
    // The gate says the family is not fully computed, and submitting is not offered as possible.
    await expect(page.getByTestId('gate-status').textContent()).resolves.toContain('Blocked');
    await expect(page.getByTestId('action-submit').isDisabled()).resolves.toBe(true);
    await page.screenshot({ path: `${SHOTS}/family-cancelled.png`, fullPage: true });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 90_000);
  it('a catalogue manager retires a published family after confirming, and its variants leave the catalogue', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'catalogue_manager');
    const listed = await expectJson<{ families: { id: string; code: string; state: string }[] }>(
      await page.request.get('/api/families?state=published'),
      200,
    );
    // The seeded demo family in the catalogue (a draft revision would make "retire" wait for its own review).
    const published = listed.families.find((family) => family.code !== CODE);
    expect(published, 'a published family to retire').toBeDefined();
    const before = await expectJson<{ variants: { family: { id: string } }[] }>(
      await page.request.get('/api/catalogue'),
      200,
    );
    expect(before.variants.some((v) => v.family.id === published!.id)).toBe(true);

    await page.goto('/review');
    await page.getByTestId('queue-published').getByTestId(`review-${published!.code}`).click();
    await page.getByTestId('action-retire').click();
    // Nothing happens before the confirmation.
    await page.getByTestId('cancel-step').click();
    await expect(textOf(page, 'family-state')).resolves.toBe('Published');
    await page.getByTestId('action-retire').click();
    await page.getByTestId('confirm-step').click();
    await page.waitForFunction(() =>
      document.querySelector('[data-testid="family-state"]')?.textContent?.includes('Retired'),
    );
    const after = await expectJson<{ variants: { family: { id: string } }[] }>(
      await page.request.get('/api/catalogue'),
      200,
    );
    expect(after.variants.some((v) => v.family.id === published!.id)).toBe(false);
    // A retired family stays findable on the manager's screen, under the Retired filter.
    await page.goto('/review');
    await page.getByTestId('queue-filter').getByText('Retired', { exact: false }).click();
    await page.getByTestId('queue-retired').getByTestId(`review-${published!.code}`).waitFor();
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);
});
