/**
 * Wholesale quotes: the pricing and lead-time arithmetic on a hand-checked case, and the API (create, list, read,
 * PDF, bad input). Lead time follows estimateFarmCapacity; the case below is worked out by hand (analytic).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { QuoteListResponseSchema, QuoteSchema } from '../shared/schemas/quote';
import type { SalesSettings } from '../shared/schemas/sales';
import { computeQuote } from '../server/services/quote';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { FIXTURE_SKUS } from './salesFixtures';
import { useSalesTestApp } from './setup/salesTestApp';

const suite = useSalesTestApp();

/** Text of a PDF by Debian's pdftotext. */
function pdfText(bytes: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'quote-'));
  const file = join(dir, 'quote.pdf');
  writeFileSync(file, bytes);
  return execFileSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' });
}

describe('computeQuote', () => {
  const settings: SalesSettings = {
    ...DEFAULT_SALES_SETTINGS,
    farm: { printers: 2, hoursPerDay: 24, copiesPerPlate: 4, failureRatePct: 0, plateChangeMin: 0, handlingDays: 1 },
    quantityBreaks: [
      { minQuantity: 10, discountPct: 10 },
      { minQuantity: 50, discountPct: 20 },
    ],
  };

  it('16 units of a 60-minute print on 2 printers, 4 a plate: 4 plates, 2 per printer, 8 h, lead time 1 + 1 days', () => {
    const variant = structuredClone(suite.fixture.variants[0]);
    variant.report.printTimeMin = 60;
    variant.priceCents = 5000;
    variant.cost.costCents = 2600;
    const today = new Date('2027-03-01T15:00:00Z');
    const quote = computeQuote(
      variant,
      { sku: variant.sku, quantity: 16, deliveryDate: '2027-03-03', customerName: 'Wren & Co' },
      settings,
      today,
    );
    // analytic: 16 / 4 = 4 plates; ceil(4 / 2) = 2 per printer; 2 × (4 × 60) min = 480 min = 1/3 day -> 1 day + 1 handling
    expect(quote.farm.plates).toBe(4);
    expect(quote.farm.platesPerPrinter).toBe(2);
    expect(quote.farm.printDays).toBeCloseTo(1 / 3, 9);
    expect(quote.farm.leadTimeDays).toBe(2);
    expect(quote.earliestDeliveryDate).toBe('2027-03-03');
    expect(quote.feasible).toBe(true);
    // 16 units reach the 10-unit break: 10 % off 50.00 = 45.00; margin (45 − 26) / 45
    expect(quote.discountPct).toBe(10);
    expect(quote.unitPriceCents).toBe(4500);
    expect(quote.totalPriceCents).toBe(16 * 4500);
    expect(quote.marginPct).toBeCloseTo(((4500 - 2600) / 4500) * 100, 9);
    expect(quote.breaks.map((b) => b.unitPriceCents)).toEqual([4500, 4000]);

    const tooSoon = computeQuote(
      variant,
      { sku: variant.sku, quantity: 16, deliveryDate: '2027-03-02', customerName: 'Wren & Co' },
      settings,
      today,
    );
    expect(tooSoon.feasible).toBe(false);
  });

  it('replaces failed prints: at 20 % failures 16 units need 5 plates of 4 (3.2 good each)', () => {
    const variant = structuredClone(suite.fixture.variants[0]);
    variant.report.printTimeMin = 60;
    const quote = computeQuote(
      variant,
      { sku: variant.sku, quantity: 16, deliveryDate: '2027-12-01', customerName: 'Wren & Co' },
      { ...settings, farm: { ...settings.farm, failureRatePct: 20 } },
      new Date('2027-03-01T00:00:00Z'),
    );
    expect(quote.farm.plates).toBe(5); // ceil(16 / 3.2) = 5
    expect(quote.farm.expectedGoodUnits).toBeGreaterThanOrEqual(16);
    expect(quote.discountPct).toBe(10);
  });

  it('takes copies per plate from the variant plate fit when the setting is empty', () => {
    const variant = structuredClone(suite.fixture.variants[0]);
    const quote = computeQuote(
      variant,
      { sku: variant.sku, quantity: 5, deliveryDate: '2027-12-01', customerName: 'Wren & Co' },
      { ...settings, farm: { ...settings.farm, copiesPerPlate: null } },
      new Date('2027-03-01T00:00:00Z'),
    );
    expect(quote.farm.copiesPerPlate).toBe(Math.max(1, variant.report.copiesPerPlate));
    expect(quote.discountPct).toBe(0);
    expect(quote.unitPriceCents).toBe(variant.priceCents);
  });
});

describe('quotes API', () => {
  it('creates a quote, lists it, reads it and renders it as a PDF', async () => {
    const sales = await suite.t.agent('sales');
    const created = await sales.post('/api/quotes').send({
      sku: FIXTURE_SKUS[0],
      quantity: 120,
      deliveryDate: '2099-06-30',
      customerName: '  Marsh Lane Garden Centre  ',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const quote = QuoteSchema.parse(created.body);
    expect(quote.customerName).toBe('Marsh Lane Garden Centre');
    expect(quote.reference).toMatch(/^Q-\d{4}$/);
    expect(quote.feasible).toBe(true);
    expect(quote.discountPct).toBe(10); // default break: 100+ units, 10 %
    expect(quote.totalPriceCents).toBe(quote.unitPriceCents * 120);
    expect(quote.unitCostCents).toBe(suite.fixture.variants[0].cost.costCents);
    expect(quote.farm.expectedGoodUnits).toBeGreaterThanOrEqual(120);
    expect(quote.createdBy.name).toBe('Ada Quill');

    const list = QuoteListResponseSchema.parse((await sales.get('/api/quotes')).body);
    expect(list.quotes.map((q) => q.id)).toContain(quote.id);

    const read = await sales.get(`/api/quotes/${quote.id}`);
    expect(read.status).toBe(200);
    expect(read.body).toEqual(created.body);

    const pdf = await sales
      .get(`/api/quotes/${quote.id}.pdf`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = pdfText(pdf.body as Buffer);
    expect(text).toContain(quote.reference);
    expect(text).toContain('Marsh Lane Garden Centre');
    expect(text).toContain(FIXTURE_SKUS[0]);
    expect(text).toContain(quote.earliestDeliveryDate);
    expect(text).not.toMatch(/margin/i); // the customer's copy carries no costs or margins
    expect(text).not.toMatch(/build plate|printers|failures|production plan/i); // nor the farm's production plan
  });

  it('says when the delivery date cannot be met', async () => {
    const sales = await suite.t.agent('sales');
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const res = await sales
      .post('/api/quotes')
      .send({ sku: FIXTURE_SKUS[1], quantity: 5000, deliveryDate: tomorrow, customerName: 'Too Soon Ltd' });
    expect(res.status).toBe(201);
    expect(res.body.feasible).toBe(false);
    expect(res.body.earliestDeliveryDate > tomorrow).toBe(true);
  });

  it('refuses a past delivery date, a part quantity and a blank customer, in words for people', async () => {
    const sales = await suite.t.agent('sales');
    const cases: Array<[object, string, string]> = [
      [{ deliveryDate: '2020-01-01' }, 'deliveryDate', 'The delivery date cannot be in the past.'],
      [{ quantity: 2.5 }, 'quantity', 'The quantity must be a whole number.'],
      [{ customerName: '   ' }, 'customerName', "Give the customer's name."],
      [{ quantity: 100_001 }, 'quantity', 'One quote can cover at most 100,000 units.'],
    ];
    for (const [change, path, message] of cases) {
      const res = await sales
        .post('/api/quotes')
        .send({ sku: FIXTURE_SKUS[0], quantity: 3, deliveryDate: '2099-01-01', customerName: 'Wren & Co', ...change });
      expect(res.status, path).toBe(400);
      expect(res.body.error.message).toBe(message);
      expect(res.body.error.details[0].path).toBe(path);
    }
  });

  it('rejects bad input naming the field, and unknown SKUs and ids', async () => {
    const sales = await suite.t.agent('sales');
    const zero = await sales
      .post('/api/quotes')
      .send({ sku: FIXTURE_SKUS[0], quantity: 0, deliveryDate: '2099-01-01', customerName: 'X' });
    expect(zero.status).toBe(400);
    expect(zero.body.error.message).toBe('The quantity must be at least 1.');
    expect(zero.body.error.details[0].path).toBe('quantity');
    const date = await sales
      .post('/api/quotes')
      .send({ sku: FIXTURE_SKUS[0], quantity: 3, deliveryDate: '31/12/2099', customerName: 'X' });
    expect(date.body.error.message).toBe('Enter the delivery date as a date such as 2027-03-01.');
    expect(date.body.error.details[0].path).toBe('deliveryDate');
    const sku = await sales
      .post('/api/quotes')
      .send({ sku: 'FH-NOPE-1', quantity: 3, deliveryDate: '2099-01-01', customerName: 'X' });
    expect(sku.status).toBe(400);
    expect(sku.body.error.message).toBe('There is no published product with the SKU FH-NOPE-1.');
    expect(sku.body.error.details[0].path).toBe('sku');
    const missing = await sales.get(`/api/quotes/${crypto.randomUUID()}`);
    expect(missing.status).toBe(404);
    const notAnId = await sales.get('/api/quotes/not-an-id');
    expect(notAnId.status).toBe(400);
  });
});
