/**
 * Fulfilment in Chromium against the real server and its own fake farm at high speed: a paid order goes to the farm
 * by itself and operations watch it reach "shipped" with a tracking number on the order page; the shipped mail is
 * captured. A second order with an address the carrier rejects is held; operations fix the postcode in the farm
 * exceptions queue and it ships. Catalogue managers plan a run from the demand screen and send it to the farm.
 * Access rules are the product's own: no outside source. Screenshots go to /tmp/nestwright-e2e.
 */
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { farmRuntime } from '../../server/farm/farmRuntime';
import { listMail } from '../../server/services/mailService';
import type { ShipTo } from '../../shared/schemas/shop';
import { payOneUnitOrder } from '../setup/paidOrder';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  process.env.FARM_FAKE_SPEED = '20000';
  process.env.FARM_POLL_MS = '200';
  process.env.FARM_RECONCILE_AFTER_S = '2';
  e2e = await startE2E({ viewport: { width: 1440, height: 960 } });
}, 300_000);

afterAll(async () => {
  await e2e?.close();
});

const ADDRESS: ShipTo = {
  name: 'Odile Thorn',
  line1: '3 Alder Close',
  line2: '',
  city: 'Ashcombe',
  region: '',
  postalCode: 'AC4 7RD',
  country: 'GB',
};

/** An order paid as the payment webhook pays it (the storefront's own browser test drives the payment page). */
async function paidOrder(shipTo: ShipTo): Promise<{ id: string; number: string }> {
  const order = await payOneUnitOrder(e2e.server.ctx, {
    shipTo,
    email: 'odile.thorn@example.test',
    siteOrigin: e2e.server.url,
  });
  expect(order.outcome).toBe('paid');
  return order;
}

describe('fulfilment in the browser', () => {
  it('shows a paid order going to shipped with a tracking number, and captures the shipped mail', async () => {
    const { id, number } = await paidOrder(ADDRESS);
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'operations');
    await page.goto(`/orders/${id}`);
    const tracking = page.getByTestId('fulfilment-tracking');
    // The order page looks again by itself while the farm has the order: no reload.
    await tracking.waitFor({ timeout: 60_000 });
    await expect.poll(() => tracking.textContent(), { timeout: 5000 }).toMatch(/^[A-Z]{2}\d{12}$/);
    await page.screenshot({ path: `${SHOTS}/fulfilment-order-shipped.png`, fullPage: true });
    expect(await page.getByTestId('fulfilment-status').textContent()).toContain('Handed to the carrier');
    expect(e2e.problems(page)).toEqual([]);

    const subjects = async () => (await listMail(e2e.server.ctx)).messages.map((m) => m.subject);
    await expect.poll(subjects, { timeout: 30_000 }).toContain(`Order ${number} is on its way`);
  }, 180_000);

  it('takes a rejected address through the exceptions queue until the order ships', async () => {
    const runtime = farmRuntime(e2e.server.ctx)!;
    runtime.fake!.floor.faults.rejectAddressesMatching = 'ZZ9';
    const { id, number } = await paidOrder({ ...ADDRESS, postalCode: 'ZZ9 9ZZ' });
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'operations');
    await page.goto('/farm/exceptions');
    const held = page.getByTestId(`held-${number}`);
    await held.waitFor({ timeout: 60_000 });
    await page.screenshot({ path: `${SHOTS}/fulfilment-exceptions.png`, fullPage: true });
    runtime.fake!.floor.faults.rejectAddressesMatching = null;
    await page.getByTestId(`fix-${number}`).click();
    await page.getByLabel('Postcode').fill('AC4 7RD');
    await page.getByTestId('redispatch-address').click();
    await held.waitFor({ state: 'detached', timeout: 30_000 });
    await expect
      .poll(
        async () => {
          const res = await page.request.get(`/api/orders/${id}`);
          return ((await res.json()) as { state: string }).state;
        },
        { timeout: 60_000 },
      )
      .toBe('shipped');
    expect(e2e.problems(page)).toEqual([]);
  }, 180_000);

  it('plans a run from the demand screen and sends it to the farm', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'catalogue_manager');
    await page.goto('/demand');
    await page.getByTestId('demand-chart').locator('canvas').first().waitFor({ timeout: 60_000 });
    await page.getByTestId('demand-plan').click();
    await page.waitForURL(/\/runs\/plan/);
    await page.getByTestId('plan-submit').click();
    await page.getByTestId('plan-figures').waitFor({ timeout: 120_000 });
    await page.screenshot({ path: `${SHOTS}/fulfilment-run-plan.png`, fullPage: true });
    await page.getByTestId('plan-send').click();
    await page.getByText(/queued for the farm/).waitFor({ timeout: 30_000 });
    expect(e2e.problems(page)).toEqual([]);
  }, 240_000);
});
