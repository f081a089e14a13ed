/**
 * The admin settings screen (/admin/settings) in Chromium against the real server: the admin renames the studio,
 * picks German (Germany) as the locale and sets the shop's VAT rate; the app bar shows the new name and the shop
 * writes its prices the German way with the new rate. A VAT rate over the limit is refused in words beside the
 * section and the field keeps what was typed. Other roles are sent away. axe-core finds no serious or critical
 * WCAG 2.x A/AA violation at 1440 and 390 px. Screenshots at 1440, 1024 and 390 px go to /tmp/nestwright-e2e/settings.
 * source: Web Content Accessibility Guidelines (WCAG) 2.2, W3C, 2023; axe-core rule impacts, Deque Systems, 2024.
 * Amounts already on the screen (a material's price beside its cents field) turn German at once after the save,
 * without a navigation. The German amount pattern ("1.234,50 €": "." grouping, "," decimals, no-break space before
 * the sign) is from Unicode CLDR locale data (Unicode Consortium; the release the runtime's ICU carries). Access
 * rules and the VAT limit are the product's own.
 */
import { mkdirSync } from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getSalesSettings } from '../../server/services/salesSettings';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e/settings';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 960 } });
}, 300_000);

afterAll(async () => {
  await e2e?.close();
});

/** Serious and critical axe violations on the page as it is now, one line each. */
async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

describe('Settings screen', () => {
  it('is not for other roles', async () => {
    for (const role of ['designer', 'sales', 'operations'] as const) {
      const page = await e2e.newPage();
      await e2e.signInAs(page, role);
      await page.goto('/admin/settings');
      await page.waitForURL((url) => url.pathname !== '/admin/settings');
      expect(await page.getByRole('heading', { name: 'Studio settings' }).count()).toBe(0);
    }
  }, 120_000);

  it('changes the name, the locale and the VAT rate, which the app and the shop then use; refuses a bad rate in words', async () => {
    const page = await e2e.newPage({ viewport: { width: 1440, height: 960 } });
    await e2e.signInAs(page, 'admin');
    await page.goto('/admin/settings');
    await page.getByRole('heading', { name: 'Studio settings', level: 1 }).waitFor();
    await page.getByTestId('save-workshop').waitFor();

    expect(await axeProblems(page)).toEqual([]);
    for (const width of [1440, 1024, 390]) {
      await page.setViewportSize({ width, height: width === 390 ? 844 : 960 });
      await page.screenshot({ path: `${SHOTS}/settings-${width}.png`, fullPage: true });
      if (width === 390) expect(await axeProblems(page)).toEqual([]);
    }
    await page.setViewportSize({ width: 1440, height: 960 });

    // A VAT rate over 50 % is refused beside the shop section; the field keeps the 80 typed.
    const vat = page.locator('#shop-vat');
    await vat.fill('80');
    await page.getByTestId('save-shop').click();
    await expect(page.getByTestId('problem-shop').textContent()).resolves.toContain('VAT rate (%) must be 50 or less.');
    expect(await vat.inputValue()).toBe('80');
    await page.locator('#shop').screenshot({ path: `${SHOTS}/shop-refused-1440.png` });

    // A rate the shop accepts is saved.
    await vat.fill('19');
    await page.getByTestId('save-shop').click();
    await page.getByText('Shop settings saved: the shop uses them now.').waitFor();
    expect((await getSalesSettings(e2e.server.ctx.db)).settings.shop.vatRatePct).toBe(19);

    // A material's price in cents shows the amount it makes, in the studio's locale (British English so far).
    const materialPrice = page.getByTestId('material-priceCentsPerKg-amount');
    expect((await materialPrice.textContent())?.trim()).toMatch(/^= €\d{1,3}(,\d{3})*\.\d{2}$/);

    // The studio's new name and locale: the app bar shows the name at once.
    await page.locator('#studio-name').fill('Wrenfield Nest Works');
    await page.locator('#studio .n-base-selection').click();
    await page.locator('.n-base-select-option', { hasText: 'German (Germany)' }).click();
    await expect(page.getByTestId('locale-preview').textContent()).resolves.toMatch(/1\.234,50\u00a0€/);
    await page.getByTestId('save-studio').click();
    await page.getByText(/^Saved: amounts and dates now read like/).waitFor();
    await expect(page.getByTestId('studio-name').textContent()).resolves.toBe('Wrenfield Nest Works');
    // Amounts already on the screen are written the German way at once, without a navigation.
    const germanAmount = /^= \d{1,3}(\.\d{3})*,\d{2}\u00a0€$/;
    await page.waitForFunction(
      (pattern) =>
        new RegExp(pattern).test(
          document.querySelector('[data-testid="material-priceCentsPerKg-amount"]')?.textContent?.trim() ?? '',
        ),
      germanAmount.source,
    );
    expect((await materialPrice.textContent())?.trim()).toMatch(germanAmount);
    expect(page.url()).toMatch(/\/admin\/settings$/);
    await page.locator('#materials').screenshot({ path: `${SHOTS}/materials-german-1440.png` });

    // The shop (a new visitor) writes prices the German way, with the new VAT rate.
    const shopper = await e2e.newPage({ viewport: { width: 390, height: 844 } });
    await shopper.goto('/shop');
    const price = shopper.locator('.price').first();
    await price.waitFor();
    expect(await price.textContent()).toMatch(/^From \d{1,3}(\.\d{3})*,\d{2}\u00a0€ incl\. 19 % VAT$/);
    await expect(shopper.getByTestId('shop-studio-name').textContent()).resolves.toBe('Wrenfield Nest Works');
    await shopper.screenshot({ path: `${SHOTS}/shop-german-390.png`, fullPage: true });

    expect(e2e.problems(page)).toEqual([]);
    expect(e2e.problems(shopper)).toEqual([]);
  }, 180_000);
});
