/**
 * Sales in Chromium, end to end through the real server and its seeded demo catalogue: Ada (sales) signs in, opens
 * the catalogue, downloads a variant's spec sheet (read back with Debian's pdftotext: SKU, hole size in mm and inches,
 * cautions), downloads the price list as CSV (parsed with csv-parse; prices sum to the catalogue's), then starts a
 * quote from the catalogue row (a part quantity is refused), prices two lines with shipping and terms, opens the
 * saved quote, downloads its PDF, marks it sent and copies it; the list's headers and amounts stay on one line.
 * Access rules are the product's own (PRODUCT.md roles): no outside source. Screenshots go to /tmp/nestwright-e2e.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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

/** Clicks something that starts a download and saves the file; returns its path. */
async function download(page: Page, click: () => Promise<void>, name: string): Promise<string> {
  const pending = page.waitForEvent('download', { timeout: 60_000 });
  await click();
  const file = await pending;
  const path = join(SHOTS, name);
  await file.saveAs(path);
  return path;
}

describe('sales in the browser', () => {
  it('downloads a spec sheet and the price list, then makes a quote and downloads it', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'sales');

    // The catalogue lists the seeded published family; its first row offers a spec sheet.
    await page.goto('/catalogue');
    const firstSku = page.getByTestId('catalogue-sku').first();
    await firstSku.waitFor({ timeout: 60_000 });
    const sku = ((await firstSku.textContent()) ?? '').trim();
    expect(sku).toMatch(/^FH-/);
    const catalogue = (await (await page.request.get('/api/catalogue')).json()) as {
      variants: Array<{ sku: string; priceCents: number; report: { facts: { entryHoleDiameterMm: number } } }>;
    };
    const variant = catalogue.variants.find((v) => v.sku === sku)!;

    const sheetPath = await download(page, () => page.getByTestId(`spec-sheet-${sku}`).click(), 'sales-spec-sheet.pdf');
    const sheet = execFileSync('pdftotext', ['-raw', sheetPath, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(sheet).toContain(sku);
    const holeMm = variant.report.facts.entryHoleDiameterMm;
    expect(sheet).toContain(`${holeMm.toFixed(0)} mm (${(holeMm / 25.4).toFixed(2)} in)`); // 1 in = 25.4 mm
    for (const caution of ['Heat.', 'Perches.', 'Mounting height.', 'Predator guards.', 'Local rules.'])
      expect(sheet).toContain(caution);
    await page.screenshot({ path: join(SHOTS, 'sales-catalogue.png') });

    // The quotes screen carries the price list downloads.
    await page.getByRole('link', { name: 'Quotes' }).first().click();
    await page.getByRole('heading', { name: 'Quotes', level: 1 }).waitFor();
    const csvPath = await download(page, () => page.getByTestId('price-list-csv').click(), 'sales-price-list.csv');
    const rows = parse(readFileSync(csvPath, 'utf8'), { columns: true, skip_empty_lines: true }) as Array<
      Record<string, string>
    >;
    expect(rows.map((r) => r.SKU).sort()).toEqual(catalogue.variants.map((v) => v.sku).sort());
    const csvSum = rows.reduce((sum, r) => sum + Number(r['Unit price']), 0);
    expect(csvSum).toBeCloseTo(
      catalogue.variants.reduce((sum, v) => sum + v.priceCents / 100, 0),
      6,
    );

    // A quote started from the catalogue row arrives with its SKU chosen.
    await page.goto('/catalogue');
    await page.getByTestId(`catalogue-actions-${sku}`).getByRole('link', { name: 'Quote' }).click();
    await page.waitForURL(/\/quotes\/new\?sku=/);
    await page.locator('#quote-customer').fill('Marsh Lane Garden Centre');
    // A part quantity is refused in words, at the field, and nothing is saved.
    await page.locator('#quote-line-0-quantity').fill('2.5');
    await page.locator('#quote-line-0-quantity').blur();
    await page.getByTestId('quote-submit').click();
    await page.getByText('Quantity must be a whole number').waitFor();
    expect(page.url()).toMatch(/\/quotes\/new/);
    await page.locator('#quote-line-0-quantity').fill('120');
    await page.locator('#quote-line-0-quantity').blur();
    // A second line at a price agreed by hand.
    const other = catalogue.variants.find((v) => v.sku !== sku)!;
    await page.getByTestId('quote-add-line').click();
    await page.locator('#quote-line-1-sku').click();
    await page.locator('#quote-line-1-sku').fill(other.sku);
    await page.keyboard.press('Enter');
    await page.locator('#quote-line-1-quantity').fill('8');
    await page.locator('#quote-line-1-price').fill('12.50');
    await page.locator('#quote-line-1-price').blur();
    await page.locator('#quote-shipping').fill('35');
    await page.locator('#quote-shipping').blur();
    await page.locator('#quote-terms').fill('Payment within 30 days of delivery.');
    await page.screenshot({ path: join(SHOTS, 'sales-new-quote.png'), fullPage: true });
    await page.getByTestId('quote-submit').click();
    await page.waitForURL(/\/quotes\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    const reference = ((await page.getByTestId('quote-reference').textContent()) ?? '').replace('Quote ', '').trim();
    expect(reference).toMatch(/^Q-\d{4}$/);
    await expect(page.getByTestId('quote-feasibility').textContent()).resolves.toMatch(/earliest delivery/i);
    await expect(page.getByTestId('quote-margin').textContent()).resolves.toMatch(/%/);
    await expect(page.getByTestId('quote-detail-line-1').textContent()).resolves.toContain(other.sku);
    await page.screenshot({ path: join(SHOTS, 'sales-quote.png'), fullPage: true });

    const quotePath = await download(page, () => page.getByTestId('quote-pdf').click(), 'sales-quote.pdf');
    const quoteText = execFileSync('pdftotext', ['-raw', quotePath, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(quoteText).toContain(reference);
    expect(quoteText).toContain('Marsh Lane Garden Centre');
    expect(quoteText).toContain(sku);
    expect(quoteText).toContain(other.sku);
    expect(quoteText).toContain('Payment within 30 days of delivery.');
    expect(quoteText).not.toMatch(/margin|build plate/i);

    // Sent, then copied into a new draft with a new reference.
    await page.getByTestId('quote-mark-sent').click();
    await page.getByTestId('quote-status').filter({ hasText: 'Sent' }).waitFor();
    await page.getByTestId('quote-copy').click();
    await page.getByText('copied from').waitFor();
    const copyRef = ((await page.getByTestId('quote-reference').textContent()) ?? '').replace('Quote ', '').trim();
    expect(copyRef).not.toBe(reference);
    await expect(page.getByTestId('quote-status').textContent()).resolves.toMatch(/Draft/);

    // Back in the list, both quotes are rows; at 1440 and 1024 px no header breaks inside a word and no amount wraps.
    await page.getByRole('link', { name: '← All quotes' }).click();
    await page.getByTestId(`quote-row-${reference}`).waitFor();
    await page.getByTestId(`quote-row-${copyRef}`).waitFor();
    for (const width of [1440, 1024]) {
      await page.setViewportSize({ width, height: 900 });
      const broken = await page.evaluate(() => {
        const cells = [
          ...document.querySelectorAll('.quotes__table th'),
          ...document.querySelectorAll('.quotes__table td .nw-figure'),
        ];
        // A text on one line has all its line boxes at one height (each text node measured on its own).
        const wraps = (cell: Element): boolean => {
          const walker = document.createTreeWalker(cell, NodeFilter.SHOW_TEXT);
          for (let node = walker.nextNode(); node; node = walker.nextNode()) {
            if (!node.textContent?.trim()) continue;
            const range = document.createRange();
            range.selectNodeContents(node);
            const tops = new Set([...range.getClientRects()].map((r) => Math.round(r.top)));
            if (tops.size > 1) return true;
          }
          return false;
        };
        return cells.filter(wraps).map((cell) => cell.textContent);
      });
      expect(broken, `at ${width} px`).toEqual([]);
      await page.screenshot({ path: join(SHOTS, `sales-quotes-${width}.png`) });
    }
    expect(e2e.problems(page)).toEqual([]);
  }, 240_000);

  it('keeps designers out of quotes', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    const answer = await page.request.get('/api/quotes');
    expect(answer.status()).toBe(403);
    await page.goto('/quotes');
    await page.waitForURL(/\/forbidden/);
  }, 120_000);
});
