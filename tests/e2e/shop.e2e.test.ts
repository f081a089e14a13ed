/**
 * The storefront in Chromium against the real server and its local payment fake:
 * 1. a signed-out customer picks a colour, adds two versions, checks out, pays with the success card on the fake's
 *    page, returns to the confirmation; the confirmation mail is captured, operations see the order paid; axe finds
 *    no serious or critical violation on any shop page on the way;
 * 2. a second customer does the whole purchase with the keyboard alone: the declined card shows its message and
 *    nothing is paid, then the success card pays;
 * 3. operations cancel the first order with a refund; the refund mail is captured.
 * The test card numbers and what they do are the payment provider's published test cards (source: "Testing", payment
 * provider's developer documentation, 2024). Accessibility rules are axe-core's WCAG 2.x rule set (source: Web
 * Content Accessibility Guidelines 2.1, W3C, 2018). Screenshots go to /tmp/nestwright-e2e.
 */
import { mkdirSync } from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import { eq } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { orders } from '../../server/db/schema';
import { listMail } from '../../server/services/mailService';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
const SUCCESS_CARD = '4242 4242 4242 4242';
const DECLINED_CARD = '4000 0000 0000 0002';
let e2e: E2E;
/** The first customer's order (paid in test 1, refunded in test 3). */
let firstOrder: { number: string; id: string } | null = null;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E();
}, 300_000);

afterAll(async () => {
  await e2e?.close();
});

/** Serious or critical axe violations on the page, as "rule: target" lines (empty when there are none). */
async function axeProblems(page: Page): Promise<string[]> {
  // AxeBuilder's page type comes from its own playwright copy; the object is the same playwright-core page.
  const result = await new AxeBuilder({ page: page as never }).withTags(['wcag2a', 'wcag2aa', 'wcag21aa']).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** The order as the database has it, by its number as people read it (`NW-1001`). */
async function orderRow(number: string) {
  const [row] = await e2e.server.ctx.db
    .select()
    .from(orders)
    .where(eq(orders.number, Number(number.replace(/^NW-/, ''))));
  return row;
}

/** Subjects of the captured mail sent to `to`. */
async function mailSubjects(to: string): Promise<string[]> {
  const { messages } = await listMail(e2e.server.ctx);
  return messages.filter((m) => JSON.stringify(m).includes(to)).map((m) => m.subject);
}

/**
 * Presses Tab (only) until the focused element matches `accept`, as a keyboard user would move through the page.
 * @returns the focused element's text or label
 */
async function tabTo(page: Page, accept: RegExp, limit = 60): Promise<string> {
  for (let i = 0; i < limit; i++) {
    await page.keyboard.press('Tab');
    const label = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el) return '';
      const input = el as HTMLInputElement;
      const labelled = input.labels?.[0]?.textContent ?? '';
      return `${el.getAttribute('aria-label') ?? ''} ${labelled} ${el.textContent ?? ''} ${input.value ?? ''}`.trim();
    });
    if (accept.test(label)) return label;
  }
  throw new Error(`Tab never reached ${accept}`);
}

describe('the storefront in the browser', () => {
  it('sells two versions to a signed-out customer who pays on the payment page; operations see it paid', async () => {
    const page = await e2e.newPage();
    const a11y: string[] = [];
    const sessionLookups: string[] = [];
    page.on('request', (request) => {
      if (request.url().includes('/api/auth/')) sessionLookups.push(request.url());
    });
    await page.goto('/shop');
    await page.locator('.card h2').first().waitFor();
    a11y.push(...(await axeProblems(page)).map((p) => `/shop ${p}`));
    await page.locator('.card-link').first().click();
    await page.getByRole('button', { name: 'Add to cart' }).waitFor();
    a11y.push(...(await axeProblems(page)).map((p) => `product ${p}`));

    // A colour, then a second colour: two versions of one design in the cart.
    const colours = page.getByRole('group', { name: /colour/i }).getByRole('radio');
    expect(await colours.count()).toBeGreaterThan(1);
    await colours.nth(1).check();
    const firstSku = (await page.locator('.sku').textContent())!;
    await page.getByRole('button', { name: 'Add to cart' }).click();
    await page.getByRole('status').filter({ hasText: 'Added 1' }).waitFor();
    await colours.nth(0).check();
    await expect.poll(() => page.locator('.sku').textContent()).not.toBe(firstSku);
    await page.getByRole('button', { name: 'Add to cart' }).click();
    await page.getByRole('link', { name: /Cart/ }).click();
    await page.getByRole('heading', { name: 'Your cart' }).waitFor();
    await expect.poll(() => page.locator('tbody tr').count()).toBe(2);
    a11y.push(...(await axeProblems(page)).map((p) => `cart ${p}`));
    await page.reload(); // the cart is kept in the browser
    await expect.poll(() => page.locator('tbody tr').count()).toBe(2);

    await page.getByRole('link', { name: 'Checkout' }).click();
    await page.getByLabel(/^E-mail/).fill('wren.halloway@example.test');
    await page.getByLabel('Full name').fill('Wren Halloway');
    await page.getByLabel('Address line 1').fill('12 Sedge Lane');
    await page.getByLabel('Town or city').fill('Millbrook');
    await page.getByLabel('Postcode').fill('MB2 4QT');
    await page.getByTestId('order-total').waitFor();
    a11y.push(...(await axeProblems(page)).map((p) => `checkout ${p}`));
    await page.screenshot({ path: `${SHOTS}/shop-checkout.png`, fullPage: true });
    await page.getByRole('button', { name: 'Continue to payment' }).click();

    // The fake's own payment page, on its own port.
    await page.getByLabel('Card number').waitFor();
    expect(new URL(page.url()).origin).not.toBe(e2e.baseUrl);
    await page.getByLabel('Card number').fill(SUCCESS_CARD);
    await page.getByRole('button', { name: /^Pay / }).click();
    const thanks = page.getByRole('heading', { name: /Thank you: order NW-\d+ is paid/ });
    await thanks.waitFor({ timeout: 30_000 });
    a11y.push(...(await axeProblems(page)).map((p) => `confirmation ${p}`));
    await page.screenshot({ path: `${SHOTS}/shop-paid.png`, fullPage: true });
    const number = /NW-\d+/.exec((await thanks.textContent())!)![0];
    const row = await orderRow(number);
    expect(row.paidAt).not.toBeNull();
    // Paid, and perhaps already taken on by the farm (the app sends paid orders there by itself).
    expect(['paid', 'in_production', 'shipped']).toContain(row.state);
    firstOrder = { number, id: row.id };
    await expect
      .poll(() => mailSubjects('wren.halloway@example.test'), { timeout: 30_000 })
      .toContain(`Order ${number} confirmed: thank you`);
    expect(a11y).toEqual([]);
    // A customer's pages never ask who is signed in (no 401 in their console).
    expect(sessionLookups).toEqual([]);
    expect(e2e.problems(page)).toEqual([]);

    const ops = await e2e.newPage();
    await e2e.signInAs(ops, 'operations');
    await ops.goto('/orders');
    await ops.getByRole('link', { name: number }).click();
    await ops.getByRole('heading', { name: `Order ${number}` }).waitFor();
    // Paid, and perhaps already taken on by the farm (the app sends paid orders there by itself).
    expect(await ops.locator('.head').textContent()).toMatch(/Paid|In production|Shipped/);
    expect(e2e.problems(ops)).toEqual([]);
  }, 180_000);

  it('lets a keyboard-only customer buy: a declined card shows its message and pays nothing, then a good card pays', async () => {
    const page = await e2e.newPage();
    await page.goto('/shop');
    const productName = (await page.locator('.card h2').first().textContent())!.trim();
    await tabTo(page, new RegExp(productName.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')));
    await page.keyboard.press('Enter');
    await page.getByRole('button', { name: 'Add to cart' }).waitFor();
    await tabTo(page, /^Add to cart$/);
    await page.keyboard.press('Enter');
    await tabTo(page, /Go to the cart/);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Your cart' }).waitFor();
    await tabTo(page, /^Checkout$/);
    await page.keyboard.press('Enter');
    await page.getByLabel('Full name').waitFor();
    const typeInto = async (label: RegExp, text: string) => {
      await tabTo(page, label);
      await page.keyboard.type(text);
    };
    await typeInto(/^E-mail/, 'moss.ferrand@example.test');
    await typeInto(/^Full name/, 'Moss Ferrand');
    await typeInto(/^Address line 1/, '4 Rookery Row');
    await typeInto(/^Town or city/, 'Elmstead');
    await typeInto(/^Postcode/, 'EL7 1AB');
    await page.getByTestId('order-total').waitFor();
    await tabTo(page, /Continue to payment/);
    await page.keyboard.press('Enter');

    await page.getByLabel('Card number').waitFor();
    // The card field has the focus when the page opens.
    await page.keyboard.type(DECLINED_CARD);
    await page.keyboard.press('Enter');
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/declined.*No money was taken/);
    await page.screenshot({ path: `${SHOTS}/shop-declined.png`, fullPage: true });
    const sessionId = new URL(page.url()).pathname.split('/').pop()!;
    const [unpaid] = await e2e.server.ctx.db.select().from(orders).where(eq(orders.paymentSessionId, sessionId));
    expect(unpaid.state).toBe('placed');
    expect(unpaid.paidAt).toBeNull();

    // The card field is focused again with the typed number kept: replace it and pay.
    await page.keyboard.press('Control+A');
    await page.keyboard.type(SUCCESS_CARD);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: /Thank you: order NW-\d+ is paid/ }).waitFor({ timeout: 30_000 });
    expect((await orderRow(String(unpaid.number))).state).not.toBe('placed');
    expect(e2e.problems(page)).toEqual([]);
  }, 180_000);

  it('lets operations cancel a paid order with a refund; the customer gets the refund mail', async () => {
    expect(firstOrder).not.toBeNull();
    const { number, id } = firstOrder!;
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'operations');
    await page.goto(`/orders/${id}`);
    await page.getByRole('button', { name: 'Cancel and refund' }).click();
    await page.getByLabel('Reason (kept in the history)').fill('Customer asked to cancel before printing.');
    await page.getByRole('button', { name: 'Refund and cancel' }).click();
    await page.locator('.head').getByText('Refunded').waitFor();
    await page
      .getByText(/Refunded in full/)
      .first()
      .waitFor();
    await page.screenshot({ path: `${SHOTS}/shop-refunded.png`, fullPage: true });
    const row = await orderRow(number);
    expect(row.state).toBe('refunded');
    await expect
      .poll(() => mailSubjects('wren.halloway@example.test'), { timeout: 30_000 })
      .toContain(`Order ${number} refunded`);
    expect(e2e.problems(page)).toEqual([]);
  }, 120_000);
});
