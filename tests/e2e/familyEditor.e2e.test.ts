/**
 * The family editor's input handling in Chromium, against the real server: Enter in a field never saves the family
 * and leaves the page; a problem with one field (a family code already in use, two axis values that would share a
 * SKU) is shown at that field, not in the side panel; and a message about an axis value always concerns the text in
 * the box now, never an earlier value. Screenshots go to /tmp/nestwright-e2e.
 *
 * These are the product's own interaction rules (common practice for forms, no outside source).
 */
import { mkdirSync } from 'node:fs';
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

/** Opens a new family as the designer and records every attempt to save it. */
async function openNewFamily(): Promise<{ page: Page; saves: string[] }> {
  const page = await e2e.newPage();
  await e2e.signInAs(page, 'designer');
  const saves: string[] = [];
  page.on('request', (request) => {
    if (request.method() === 'POST' && new URL(request.url()).pathname === '/api/families') saves.push(request.url());
  });
  await page.goto('/families/new');
  await page.locator('#family-name').waitFor();
  return { page, saves };
}

/** The problem text shown under the field whose input has `inputId`, or '' when none is shown. */
async function feedbackOf(page: Page, inputId: string): Promise<string> {
  const item = page.locator(`.n-form-item:has(#${inputId})`);
  const feedback = item.locator('.n-form-item-feedback');
  return (await feedback.count()) ? ((await feedback.first().textContent()) ?? '').trim() : '';
}

describe('the family editor keeps input where it belongs', () => {
  it('Enter in a field does not save the family or leave the page; Enter in an axis value adds it', async () => {
    const { page, saves } = await openNewFamily();
    await page.locator('#family-name').fill('Enter-key family');
    await page.locator('#family-code').fill('ENK');
    await page.getByTestId('add-param-axis').click();
    await page.locator('#axis-input-entryHoleDiameterMm').fill('28');
    await page.locator('#axis-input-entryHoleDiameterMm').press('Enter');
    await page.getByTestId('axis-value-entryHoleDiameterMm-28').waitFor();

    // The form could be saved now; Enter in the name, the code and the support budget must still not do it.
    await expect(page.getByTestId('save-family').isDisabled()).resolves.toBe(false);
    for (const id of ['family-name', 'family-code', 'support-budget']) await page.locator(`#${id}`).press('Enter');
    // Adding a second value afterwards proves the page handled the key presses and is still the editor.
    await page.locator('#axis-input-entryHoleDiameterMm').fill('32');
    await page.locator('#axis-input-entryHoleDiameterMm').press('Enter');
    await page.getByTestId('axis-value-entryHoleDiameterMm-32').waitFor();
    expect(new URL(page.url()).pathname).toBe('/families/new');
    expect(saves).toEqual([]);
    await expect(page.locator('#family-name').inputValue()).resolves.toBe('Enter-key family');
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);

  it('a message about an axis value concerns the text typed now: "abc" replaces an older range message', async () => {
    const { page } = await openNewFamily();
    await page.getByTestId('add-param-axis').click();
    const axis = page.getByTestId('axis-entryHoleDiameterMm');
    const input = page.locator('#axis-input-entryHoleDiameterMm');
    await input.fill('500');
    await input.press('Enter');
    await expect(axis.getByRole('alert').textContent()).resolves.toMatch(/500 mm is above the highest/);
    // Typing changes the value: the message about 500 leaves at once.
    await input.fill('abc');
    await expect(axis.getByRole('alert').count()).resolves.toBe(0);
    await input.press('Enter');
    const text = (await axis.getByRole('alert').textContent()) ?? '';
    expect(text).toContain('“abc” is not a number');
    expect(text).not.toMatch(/500/);
    // Nothing was added by the refused inputs.
    await expect(page.locator('[data-testid^="axis-value-entryHoleDiameterMm-"]').count()).resolves.toBe(0);
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 60_000);

  it('a family code in use and values that share a SKU are shown at their field, and leave when it changes', async () => {
    const { page, saves } = await openNewFamily();
    await page.locator('#family-name').fill('Clashing family');
    // HGB is the code of a demo family that already exists.
    await page.locator('#family-code').fill('HGB');
    await page.getByTestId('add-param-axis').click();
    await page.locator('#axis-input-entryHoleDiameterMm').fill('28');
    await page.getByTestId('axis-add-entryHoleDiameterMm').click();
    await page.getByTestId('axis-value-entryHoleDiameterMm-28').waitFor();

    // Two finishes whose SKU segments coincide (MATT): the problem is on the finish axis, not in the side panel.
    await page.getByTestId('add-finish-axis').click();
    const finish = page.getByTestId('axis-finish');
    for (const value of ['matte-coat', 'matte-clear']) {
      await finish.getByLabel('New finish').fill(value);
      await finish.getByLabel('New finish').press('Enter');
    }
    await expect(page.getByTestId('axis-problems-finish').textContent()).resolves.toMatch(
      /“matte-clear” and “matte-coat” would share the SKU code MATT/,
    );
    await expect(page.getByTestId('variant-count').textContent()).resolves.not.toMatch(/SKU code MATT/);
    await expect(page.getByTestId('spec-problems').count()).resolves.toBe(0);
    await page.screenshot({ path: `${SHOTS}/family-editor-sku-clash.png`, fullPage: true });
    await finish.getByRole('button', { name: 'Remove the Finish axis' }).click();

    // Saving with a code in use: the server's answer is shown under the SKU code field.
    await page.getByTestId('save-family').click();
    await page
      .locator('.n-form-item:has(#family-code) .n-form-item-feedback')
      .filter({ hasText: 'Another family already uses' })
      .waitFor();
    expect(await feedbackOf(page, 'family-code')).toBe('Another family already uses the code HGB: choose another.');
    await expect(page.getByTestId('save-error').textContent()).resolves.not.toContain('HGB');
    expect(saves.length).toBe(1);
    expect(new URL(page.url()).pathname).toBe('/families/new');
    await page.screenshot({ path: `${SHOTS}/family-editor-code-taken.png`, fullPage: true });

    // A new code: the old message is gone from the field and the side panel.
    await page.locator('#family-code').fill('HGQ');
    // (the feedback fades out, so wait until it has left)
    await page
      .locator('.n-form-item:has(#family-code) .n-form-item-feedback')
      .filter({ hasText: 'HGB' })
      .waitFor({ state: 'detached' });
    await expect(page.getByTestId('save-error').count()).resolves.toBe(0);
    expect(e2e.problems(page).filter((problem) => !/409/.test(problem))).toEqual([]);
    await page.context().close();
  }, 60_000);
});
