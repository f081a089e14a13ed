/**
 * Sales in Chromium, end to end through the real server and its seeded demo catalogue: Ada (sales) signs in, opens
 * the catalogue, downloads a variant's spec sheet (read back with Debian's pdftotext: SKU, hole size in mm and inches,
 * cautions), downloads the price list as CSV (parsed with csv-parse; prices sum to the catalogue's), then starts a
 * quote from the catalogue row, prices 120 units for a garden centre, opens the saved quote and downloads its PDF.
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
    await page.waitForURL(/\/quotes\?sku=/);
    await page.locator('#quote-quantity').fill('120');
    await page.locator('#quote-quantity').blur();
    await page.locator('#quote-customer').fill('Marsh Lane Garden Centre');
    await page.screenshot({ path: join(SHOTS, 'sales-new-quote.png') });
    await page.getByTestId('quote-submit').click();
    await page.waitForURL(/\/quotes\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    const reference = ((await page.getByTestId('quote-reference').textContent()) ?? '').replace('Quote ', '').trim();
    expect(reference).toMatch(/^Q-\d{4}$/);
    await expect(page.getByTestId('quote-feasibility').textContent()).resolves.toMatch(/earliest delivery/i);
    await expect(page.getByTestId('quote-margin').textContent()).resolves.toMatch(/%/);
    await page.screenshot({ path: join(SHOTS, 'sales-quote.png'), fullPage: true });

    const quotePath = await download(page, () => page.getByTestId('quote-pdf').click(), 'sales-quote.pdf');
    const quoteText = execFileSync('pdftotext', ['-raw', quotePath, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(quoteText).toContain(reference);
    expect(quoteText).toContain('Marsh Lane Garden Centre');
    expect(quoteText).toContain(sku);

    // Back in the list, the new quote is a row.
    await page.getByRole('link', { name: '← All quotes' }).click();
    await page.getByTestId(`quote-row-${reference}`).waitFor();
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
