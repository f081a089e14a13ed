/**
 * Wholesale quotes: pricing, totals and lead time on hand-checked cases, the life of a quote (draft, sent, accepted,
 * expired), and the API (create with lines, edit, copy, state changes, bad input, the customer's PDF).
 * Lead time follows estimateFarmCapacity; the farm cases below are worked out by hand (analytic).
 * Money rule: line totals exact; tax once on goods + shipping, rounded half up to the cent (common practice, no
 * source); shipping taxed with the goods (HM Revenue & Customs, VAT Notice 700/24 "Postage and delivery charges").
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { quoteTotals, taxHalfUp } from '../shared/quotes/quoteTotals';
import { isQuoteEditable, quoteStatusOn, quoteTransitionRefusal } from '../shared/quotes/quoteStatus';
import { QuoteListResponseSchema, QuoteSchema, type QuoteInput } from '../shared/schemas/quote';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import type { SalesSettings } from '../shared/schemas/sales';
import { computeQuote, variantPlateRule } from '../server/services/quote';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { quotes } from '../server/db/schema';
import { demoPersonId } from '../server/db/seedDemo';
import { DEFAULT_PRINTERS } from '../shared/production/defaults';
import { FIXTURE_SKUS, publishFixtureFamily } from './salesFixtures';
import { binaryBody, useSalesTestApp } from './setup/salesTestApp';

const suite = useSalesTestApp();

/** Text of a PDF by Debian's pdftotext, white space folded. */
function pdfText(bytes: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'quote-'));
  const file = join(dir, 'quote.pdf');
  writeFileSync(file, bytes);
  return execFileSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

/** A quote body with defaults for what a case does not set. */
function body(change: Partial<QuoteInput> & Record<string, unknown> = {}): Record<string, unknown> {
  return {
    customerName: 'Wren & Co',
    deliveryDate: '2099-01-01',
    lines: [{ sku: FIXTURE_SKUS[0], quantity: 3 }],
    ...change,
  };
}

describe('quote totals', () => {
  it('adds lines exactly and taxes goods + shipping once, rounded half up', () => {
    // By hand: 16 × 45.00 = 720.00; 7 × 12.99 = 90.93; goods 810.93; + shipping 35.00 = 845.93 taxable;
    // 20 % of 845.93 = 169.186 -> 169.19; total 845.93 + 169.19 = 1,015.12.
    const totals = quoteTotals({
      lines: [
        { quantity: 16, unitPriceCents: 4500 },
        { quantity: 7, unitPriceCents: 1299 },
      ],
      shippingCents: 3500,
      taxRatePct: 20,
    });
    expect(totals.lineTotalsCents).toEqual([72_000, 9093]);
    expect(totals.subtotalCents).toBe(81_093);
    expect(totals.taxCents).toBe(16_919);
    expect(totals.totalCents).toBe(101_512);
  });

  it('rounds an exact half cent up and works in hundredths of a percent without drift', () => {
    // By hand: 7.25 % of 10.00 = 0.725 -> 0.73; 5 % of 0.50 = 0.025 -> 0.03; 8.1 % of 0.10 = 0.0081 -> 0.01;
    // 19 % of 0.05 = 0.0095 -> 0.01; 0 % -> 0.
    expect(taxHalfUp(1000, 7.25)).toBe(73);
    expect(taxHalfUp(50, 5)).toBe(3);
    expect(taxHalfUp(10, 8.1)).toBe(1);
    expect(taxHalfUp(5, 19)).toBe(1);
    expect(taxHalfUp(123_456, 0)).toBe(0);
    // 21 % of 1,234.57 = 259.2597 -> 259.26
    expect(taxHalfUp(123_457, 21)).toBe(25_926);
  });
});

describe('quote states', () => {
  it('reads a draft or sent quote past its validity date as expired, never an accepted one', () => {
    expect(quoteStatusOn('draft', '2027-03-01', '2027-03-01')).toBe('draft');
    expect(quoteStatusOn('draft', '2027-03-01', '2027-03-02')).toBe('expired');
    expect(quoteStatusOn('sent', '2027-03-01', '2027-03-02')).toBe('expired');
    expect(quoteStatusOn('accepted', '2027-03-01', '2028-01-01')).toBe('accepted');
    expect(isQuoteEditable('draft') && isQuoteEditable('sent')).toBe(true);
    expect(isQuoteEditable('accepted') || isQuoteEditable('expired')).toBe(false);
  });

  it('allows draft → sent → accepted and expiring by hand; accepted and expired are final', () => {
    expect(quoteTransitionRefusal('draft', 'sent')).toBeNull();
    expect(quoteTransitionRefusal('sent', 'accepted')).toBeNull();
    expect(quoteTransitionRefusal('sent', 'draft')).toBeNull();
    expect(quoteTransitionRefusal('draft', 'expired')).toBeNull();
    expect(quoteTransitionRefusal('draft', 'accepted')).toBe(
      'Send the quote to the customer before marking it accepted.',
    );
    expect(quoteTransitionRefusal('accepted', 'sent')).toMatch(/accepted, which is final/);
    expect(quoteTransitionRefusal('expired', 'sent')).toMatch(/has expired/);
    expect(quoteTransitionRefusal('sent', 'sent')).toBe('This quote is already sent.');
  });
});

describe('computeQuote', () => {
  const settings: SalesSettings = {
    ...DEFAULT_SALES_SETTINGS,
    farm: { printers: 2, hoursPerDay: 24, copiesPerPlate: 4, failureRatePct: 0, plateChangeMin: 0, handlingDays: 1 },
    quantityBreaks: [
      { minQuantity: 10, discountPct: 10 },
      { minQuantity: 50, discountPct: 20 },
    ],
  };
  const variantOf = (sku: string, printTimeMin: number, priceCents: number, costCents: number): CatalogueVariant => {
    const variant = structuredClone(suite.fixture.variants[0]);
    variant.sku = sku;
    variant.report.printTimeMin = printTimeMin;
    variant.priceCents = priceCents;
    variant.cost.costCents = costCents;
    return variant;
  };
  const today = new Date('2027-03-01T15:00:00Z');
  /** The printers a new studio starts with (what the seed writes into its database). */
  const printers = new Map(DEFAULT_PRINTERS.map((p) => [p.id, p]));
  const input = (lines: QuoteInput['lines'], deliveryDate = '2027-03-03'): QuoteInput => ({
    customerName: 'Wren & Co',
    deliveryDate,
    terms: '',
    taxRatePct: 0,
    shippingCents: 0,
    lines,
  });

  it('16 units of a 60-minute print on 2 printers, 4 a plate: 4 plates, 2 per printer, 8 h, lead time 1 + 1 days', () => {
    const variants = new Map([['A-1', variantOf('A-1', 60, 5000, 2600)]]);
    const quote = computeQuote(variants, input([{ sku: 'A-1', quantity: 16 }]), settings, today, printers);
    const [line] = quote.lines;
    // analytic: 16 / 4 = 4 plates; ceil(4 / 2) = 2 per printer; 2 × (4 × 60) min = 480 min = 1/3 day -> 1 day + 1 handling
    expect(line.farm.plates).toBe(4);
    expect(line.farm.platesPerPrinter).toBe(2);
    expect(line.farm.printDays).toBeCloseTo(1 / 3, 9);
    expect(quote.farm.leadTimeDays).toBe(2);
    expect(quote.earliestDeliveryDate).toBe('2027-03-03');
    expect(quote.feasible).toBe(true);
    // 16 units reach the 10-unit break: 10 % off 50.00 = 45.00; margin (45 − 26) / 45
    expect(line.discountPct).toBe(10);
    expect(line.breakPriceCents).toBe(4500);
    expect(line.unitPriceCents).toBe(4500);
    expect(line.priceSetByHand).toBe(false);
    expect(line.lineTotalCents).toBe(16 * 4500);
    expect(line.marginPct).toBeCloseTo(((4500 - 2600) / 4500) * 100, 9);
    expect(line.breaks.map((b) => b.unitPriceCents)).toEqual([4500, 4000]);
    // No tax or shipping: valid 30 days from the quote date by default.
    expect(quote.totalCents).toBe(72_000);
    expect(quote.validUntil).toBe('2027-03-31');

    const tooSoon = computeQuote(
      variants,
      input([{ sku: 'A-1', quantity: 16 }], '2027-03-02'),
      settings,
      today,
      printers,
    );
    expect(tooSoon.feasible).toBe(false);
  });

  it('prints the lines one after another: two lines of 1/3 day and 1/2 day take 1 print day + 1 handling', () => {
    const variants = new Map([
      ['A-1', variantOf('A-1', 60, 5000, 2600)],
      ['B-2', variantOf('B-2', 90, 2000, 800)],
    ]);
    const quote = computeQuote(
      variants,
      {
        ...input([
          { sku: 'A-1', quantity: 16 },
          { sku: 'B-2', quantity: 7, unitPriceCents: 1299 },
        ]),
        taxRatePct: 20,
        shippingCents: 3500,
      },
      settings,
      today,
      printers,
    );
    // analytic, line B: ceil(7 / 4) = 2 plates, 1 per printer, 4 × 90 min = 360 min = 1/4 day.
    // Together: 1/3 + 1/4 = 7/12 day -> 1 day + 1 handling day.
    expect(quote.lines[1].farm.plates).toBe(2);
    expect(quote.lines[1].farm.printDays).toBeCloseTo(0.25, 9);
    expect(quote.farm.plates).toBe(6);
    expect(quote.farm.printDays).toBeCloseTo(7 / 12, 9);
    expect(quote.farm.leadTimeDays).toBe(2);
    // The agreed price of line B replaces its break price (7 units reach no break: 20.00).
    expect(quote.lines[1].breakPriceCents).toBe(2000);
    expect(quote.lines[1].unitPriceCents).toBe(1299);
    expect(quote.lines[1].priceSetByHand).toBe(true);
    // Totals by hand: see 'quote totals' above: 810.93 goods, 35.00 shipping, 169.19 tax, 1,015.12 in all.
    expect(quote.subtotalCents).toBe(81_093);
    expect(quote.taxCents).toBe(16_919);
    expect(quote.totalCents).toBe(101_512);
    // Cost 16 × 26.00 + 7 × 8.00 = 472.00; margin on goods (810.93 − 472.00) / 810.93 = 41.795… %
    expect(quote.costCents).toBe(47_200);
    expect(quote.marginPct).toBeCloseTo(((81_093 - 47_200) / 81_093) * 100, 9);
  });

  it('replaces failed prints: at 20 % failures 16 units need 5 plates of 4 (3.2 good each)', () => {
    const variants = new Map([['A-1', variantOf('A-1', 60, 5000, 2600)]]);
    const quote = computeQuote(
      variants,
      input([{ sku: 'A-1', quantity: 16 }], '2027-12-01'),
      { ...settings, farm: { ...settings.farm, failureRatePct: 20 } },
      today,
      printers,
    );
    expect(quote.lines[0].farm.plates).toBe(5); // ceil(16 / 3.2) = 5
    expect(quote.lines[0].farm.expectedGoodUnits).toBeGreaterThanOrEqual(16);
  });

  it('takes copies per plate from the variant plate fit when the setting is empty', () => {
    const variant = structuredClone(suite.fixture.variants[0]);
    const quote = computeQuote(
      new Map([[variant.sku, variant]]),
      input([{ sku: variant.sku, quantity: 5 }], '2027-12-01'),
      { ...settings, farm: { ...settings.farm, copiesPerPlate: null } },
      today,
      printers,
    );
    expect(quote.lines[0].farm.copiesPerPlate).toBe(Math.max(1, variant.report.copiesPerPlate));
    expect(quote.lines[0].discountPct).toBe(0);
    expect(quote.lines[0].unitPriceCents).toBe(variant.priceCents);
  });
});

/**
 * A variant computed before its plate rule was stored with the report: a body of 120 × 120 × 200 mm and a floor plug
 * of 100 × 100 × 10 mm, on the given printer.
 * By hand, with 10 mm between parts: on a 180 × 180 mm plate body + gap + plug = 230 mm > 180 mm either way, so each
 * part prints on plates of its own, one a plate (floor((180 + 10) / (120 + 10)) = 1, floor((180 + 10) / (100 + 10))
 * = 1); on the 246 × 238 mm plate of the first seeded printer 230 mm ≤ 246 mm, so a set goes on one plate.
 */
function variantWithoutStoredRule(base: CatalogueVariant, sku: string, printerId: string): CatalogueVariant {
  const variant = structuredClone(base);
  variant.sku = sku;
  variant.report.printerId = printerId;
  variant.report.partSizesMm = [
    [120, 120, 200],
    [100, 100, 10],
  ];
  delete variant.report.plate;
  return variant;
}

/** A printer profile with a 180 × 180 × 250 mm build volume (invented for the tests). */
function compactPrinter(id: string) {
  return { ...DEFAULT_PRINTERS[0], id, name: 'Hazel compact 0.6 mm', buildVolumeMm: { x: 180, y: 180, z: 250 } };
}

describe('variantPlateRule', () => {
  it('works the rule out on the printer from the list it is given, not on the built-in printers', () => {
    const seeded = DEFAULT_PRINTERS[0];
    const variant = variantWithoutStoredRule(suite.fixture.variants[0], 'A-1', seeded.id);
    // The seeded printer as shipped: both parts on one plate.
    expect(variantPlateRule(variant, new Map([[seeded.id, seeded]]))?.layout).toBe('together');
    // The same printer after an admin set a smaller build volume in the database: plates of their own.
    const changed = { ...seeded, buildVolumeMm: { x: 180, y: 180, z: 250 } };
    const rule = variantPlateRule(variant, new Map([[seeded.id, changed]]));
    expect(rule?.layout).toBe('separate');
    expect(rule?.platesPerUnit).toBe(2);
    expect(rule?.text).toBe('2 plates per unit: body 1 per plate, floor plug 1 per plate');
    // A printer only the database knows.
    const added = compactPrinter('hazel-compact-06');
    const onAdded = variantWithoutStoredRule(suite.fixture.variants[0], 'A-2', added.id);
    expect(variantPlateRule(onAdded, new Map([[added.id, added]]))?.platesPerUnit).toBe(2);
    // A printer the list does not hold: no rule (the stored copies per plate are used).
    expect(variantPlateRule(onAdded, new Map([[seeded.id, seeded]]))).toBeNull();
  });
});

describe('quotes API', () => {
  it('plans the plates of a variant on a printer an admin added', async () => {
    const admin = await suite.t.agent('admin');
    const printer = compactPrinter('hazel-compact-quotes');
    expect((await admin.put(`/api/settings/printers/${printer.id}`).send(printer)).status).toBe(201);
    const variant = variantWithoutStoredRule(suite.fixture.variants[0], 'FH-TSC-32-SAND', printer.id);
    variant.family.code = 'TSC';
    await publishFixtureFamily(suite.t.ctx.db, [variant], await demoPersonId(suite.t.ctx.db, 'designer'));

    const sales = await suite.t.agent('sales');
    const created = await sales.post('/api/quotes').send(body({ lines: [{ sku: variant.sku, quantity: 3 }] }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const farm = QuoteSchema.parse(created.body).lines[0].farm;
    // By hand (see variantWithoutStoredRule): the body and the plug each on plates of their own, one a plate.
    expect(farm.platesPerUnit).toBe(2);
    expect(farm.plateText).toBe('2 plates per unit: body 1 per plate, floor plug 1 per plate');
    expect(farm.groups?.map((g) => g.unitsPerPlate)).toEqual([1, 1]);
  });

  it('creates a quote with several lines, lists it and reads it back', async () => {
    const sales = await suite.t.agent('sales');
    const created = await sales.post('/api/quotes').send(
      body({
        customerName: '  Marsh Lane Garden Centre  ',
        deliveryDate: '2099-06-30',
        validUntil: '2099-05-31',
        terms: '  Payment within 30 days of delivery.  ',
        taxRatePct: 20,
        shippingCents: 3500,
        lines: [
          { sku: FIXTURE_SKUS[0], quantity: 120 },
          { sku: FIXTURE_SKUS[1], quantity: 7, unitPriceCents: 1299 },
        ],
      }),
    );
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const quote = QuoteSchema.parse(created.body);
    expect(quote.customerName).toBe('Marsh Lane Garden Centre');
    expect(quote.terms).toBe('Payment within 30 days of delivery.');
    expect(quote.reference).toMatch(/^Q-\d{4}$/);
    expect(quote.status).toBe('draft');
    expect(quote.validUntil).toBe('2099-05-31');
    expect(quote.lines.map((l) => [l.sku, l.quantity])).toEqual([
      [FIXTURE_SKUS[0], 120],
      [FIXTURE_SKUS[1], 7],
    ]);
    // Independent hand calculation from the list prices: 120 units reach the default 100-unit break (10 %).
    const [first, second] = suite.fixture.variants;
    const firstUnit = Math.round(first.priceCents * 0.9);
    expect(quote.lines[0].discountPct).toBe(10);
    expect(quote.lines[0].unitPriceCents).toBe(firstUnit);
    expect(quote.lines[1].unitPriceCents).toBe(1299);
    const goods = 120 * firstUnit + 7 * 1299;
    const taxable = goods + 3500;
    const tax = Math.floor((taxable * 20 + 50) / 100); // half up: 20 % in whole cents, halves rounded up
    expect(quote.subtotalCents).toBe(goods);
    expect(quote.taxCents).toBe(tax);
    expect(quote.totalCents).toBe(goods + 3500 + tax);
    expect(quote.costCents).toBe(120 * first.cost.costCents + 7 * second.cost.costCents);
    expect(quote.createdBy.name).toBe('Ada Quill');

    const list = QuoteListResponseSchema.parse((await sales.get('/api/quotes')).body);
    const row = list.quotes.find((q) => q.id === quote.id);
    expect(row).toMatchObject({ lineCount: 2, units: 127, firstSku: FIXTURE_SKUS[0], totalCents: quote.totalCents });

    const read = await sales.get(`/api/quotes/${quote.id}`);
    expect(read.status).toBe(200);
    expect(read.body).toEqual(created.body);
  });

  it('edits a draft or sent quote (a sent one becomes a draft again), never an accepted one', async () => {
    const sales = await suite.t.agent('sales');
    const quote = (await sales.post('/api/quotes').send(body())).body as { id: string; reference: string };
    const edited = await sales.put(`/api/quotes/${quote.id}`).send(
      body({
        customerName: 'Wren & Co (garden shop)',
        lines: [
          { sku: FIXTURE_SKUS[1], quantity: 4 },
          { sku: FIXTURE_SKUS[0], quantity: 2 },
        ],
        shippingCents: 1000,
      }),
    );
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body.reference).toBe(quote.reference);
    expect(edited.body.customerName).toBe('Wren & Co (garden shop)');
    expect(edited.body.lines.map((l: { sku: string }) => l.sku)).toEqual([FIXTURE_SKUS[1], FIXTURE_SKUS[0]]);
    const [first, second] = suite.fixture.variants;
    expect(edited.body.totalCents).toBe(4 * second.priceCents + 2 * first.priceCents + 1000);

    expect((await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'sent' })).body.status).toBe('sent');
    const resent = await sales
      .put(`/api/quotes/${quote.id}`)
      .send(body({ lines: [{ sku: FIXTURE_SKUS[0], quantity: 5 }] }));
    expect(resent.status).toBe(200);
    expect(resent.body.status).toBe('draft');

    await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'sent' });
    const accepted = await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'accepted' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.status).toBe('accepted');
    const late = await sales.put(`/api/quotes/${quote.id}`).send(body());
    expect(late.status).toBe(409);
    expect(late.body.error.message).toBe(
      'This quote has been accepted and can no longer be changed. Copy it to make a new one.',
    );
    const back = await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'sent' });
    expect(back.status).toBe(409);
    expect(back.body.error.message).toBe('This quote has been accepted, which is final. Copy it to make a new one.');
  });

  it('refuses illegal state changes with 409 and reads a quote past its date as expired', async () => {
    const sales = await suite.t.agent('sales');
    const quote = (await sales.post('/api/quotes').send(body())).body as { id: string };
    const early = await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'accepted' });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toBe('Send the quote to the customer before marking it accepted.');
    const unknown = await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'won' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toBe('Choose draft, sent, accepted or expired.');

    await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'sent' });
    // The validity date passes (moved back in the database, as time would).
    await suite.t.ctx.db.update(quotes).set({ validUntil: '2020-01-31' }).where(eq(quotes.id, quote.id));
    const read = await sales.get(`/api/quotes/${quote.id}`);
    expect(read.body.status).toBe('expired');
    expect((await sales.get('/api/quotes')).body.quotes.find((q: { id: string }) => q.id === quote.id).status).toBe(
      'expired',
    );
    const accept = await sales.post(`/api/quotes/${quote.id}/status`).send({ status: 'accepted' });
    expect(accept.status).toBe(409);
    expect(accept.body.error.message).toBe('This quote has expired. Copy it to make a new one with new dates.');
    expect((await sales.put(`/api/quotes/${quote.id}`).send(body())).status).toBe(409);

    const expireByHand = (await sales.post('/api/quotes').send(body())).body as { id: string };
    const expired = await sales.post(`/api/quotes/${expireByHand.id}/status`).send({ status: 'expired' });
    expect(expired.body.status).toBe('expired');
  });

  it('copies a quote into a new draft with a new reference, keeping agreed prices', async () => {
    const sales = await suite.t.agent('sales');
    const source = (
      await sales.post('/api/quotes').send(
        body({
          terms: 'Delivered to the shop door.',
          taxRatePct: 7.25,
          shippingCents: 1250,
          lines: [
            { sku: FIXTURE_SKUS[0], quantity: 3, unitPriceCents: 999 },
            { sku: FIXTURE_SKUS[1], quantity: 2 },
          ],
        }),
      )
    ).body as { id: string; reference: string; totalCents: number };
    await sales.post(`/api/quotes/${source.id}/status`).send({ status: 'sent' });
    await sales.post(`/api/quotes/${source.id}/status`).send({ status: 'accepted' });
    // An old quote whose dates have passed: the copy gets dates from today.
    await suite.t.ctx.db
      .update(quotes)
      .set({ deliveryDate: '2020-02-01', validUntil: '2020-01-31' })
      .where(eq(quotes.id, source.id));

    const copy = await sales.post(`/api/quotes/${source.id}/copy`);
    expect(copy.status, JSON.stringify(copy.body)).toBe(201);
    const quote = QuoteSchema.parse(copy.body);
    expect(quote.id).not.toBe(source.id);
    expect(quote.reference).not.toBe(source.reference);
    expect(quote.status).toBe('draft');
    expect(quote.copiedFrom).toEqual({ id: source.id, reference: source.reference });
    expect(quote.terms).toBe('Delivered to the shop door.');
    expect(quote.lines.map((l) => [l.sku, l.quantity, l.unitPriceCents, l.priceSetByHand])).toEqual([
      [FIXTURE_SKUS[0], 3, 999, true],
      [FIXTURE_SKUS[1], 2, suite.fixture.variants[1].priceCents, false],
    ]);
    expect(quote.totalCents).toBe(source.totalCents);
    const today = new Date().toISOString().slice(0, 10);
    expect(quote.validUntil > today).toBe(true);
    expect(quote.deliveryDate).toBe(quote.earliestDeliveryDate);
  });

  it('says when the delivery date cannot be met', async () => {
    const sales = await suite.t.agent('sales');
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const res = await sales
      .post('/api/quotes')
      .send(body({ deliveryDate: tomorrow, lines: [{ sku: FIXTURE_SKUS[1], quantity: 5000 }] }));
    expect(res.status).toBe(201);
    expect(res.body.feasible).toBe(false);
    expect(res.body.earliestDeliveryDate > tomorrow).toBe(true);
  });

  it('refuses bad input in words for people, naming no field keys, and keeps nothing', async () => {
    const sales = await suite.t.agent('sales');
    const before = (await sales.get('/api/quotes')).body.quotes.length;
    const cases: Array<[Record<string, unknown>, string, string]> = [
      [{ deliveryDate: '2020-01-01' }, 'deliveryDate', 'The delivery date cannot be in the past.'],
      [
        { lines: [{ sku: FIXTURE_SKUS[0], quantity: 2.5 }] },
        'lines.0.quantity',
        'Quantity must be a whole number, such as 50: quotes are for whole units.',
      ],
      [{ customerName: '   ' }, 'customerName', "Enter the customer's name."],
      [{ customerName: undefined }, 'customerName', "Enter the customer's name."],
      [{ validUntil: '2020-01-01' }, 'validUntil', 'The quote cannot be valid only until a day that has passed.'],
      [{ lines: [] }, 'lines', 'Add at least one line.'],
      [{ lines: [{ sku: '   ', quantity: 3 }] }, 'lines.0.sku', 'Choose a product for every line.'],
      [{ taxRatePct: 7.125 }, 'taxRatePct', 'Give the tax rate with at most two decimals, such as 7.25.'],
      [{ shippingCents: -100 }, 'shippingCents', 'Shipping cannot be below zero.'],
      [
        { lines: [{ sku: FIXTURE_SKUS[0], quantity: 100_001 }] },
        'lines.0.quantity',
        'One line can cover at most 100,000 units.',
      ],
      [
        { lines: [{ sku: 'FH-NOPE-1', quantity: 3 }] },
        'lines.0.sku',
        'There is no published product with the SKU FH-NOPE-1.',
      ],
    ];
    for (const [change, path, message] of cases) {
      const res = await sales.post('/api/quotes').send(body(change));
      expect(res.status, path).toBe(400);
      expect(res.body.error.message, path).toBe(message);
      expect(res.body.error.message).not.toMatch(/[a-z]+[A-Z][a-z]+/); // no camelCase field keys
      expect(res.body.error.details[0].path).toBe(path);
    }
    expect((await sales.get('/api/quotes')).body.quotes.length).toBe(before);
    const missing = await sales.get(`/api/quotes/${crypto.randomUUID()}`);
    expect(missing.status).toBe(404);
    expect((await sales.get('/api/quotes/not-an-id')).status).toBe(400);
    expect((await sales.post(`/api/quotes/${crypto.randomUUID()}/copy`)).status).toBe(404);
  });

  it("renders the customer's PDF: lines, shipping, tax, total, validity and terms; no cost, margin or farm plan", async () => {
    const sales = await suite.t.agent('sales');
    const quote = QuoteSchema.parse(
      (
        await sales.post('/api/quotes').send(
          body({
            customerName: 'Marsh Lane Garden Centre',
            validUntil: '2098-12-31',
            terms: 'Payment within 30 days of delivery.',
            taxRatePct: 20,
            shippingCents: 3500,
            lines: [
              { sku: FIXTURE_SKUS[0], quantity: 120 },
              { sku: FIXTURE_SKUS[1], quantity: 7, unitPriceCents: 1299 },
            ],
          }),
        )
      ).body,
    );
    const pdf = await sales.get(`/api/quotes/${quote.id}.pdf`).buffer(true).parse(binaryBody);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = pdfText(pdf.body as Buffer);
    const euro = (cents: number) =>
      new Intl.NumberFormat('en-GB', { style: 'currency', currency: quote.currency }).format(cents / 100);
    expect(text).toContain(quote.reference);
    expect(text).toContain('Marsh Lane Garden Centre');
    for (const line of quote.lines) {
      expect(text).toContain(line.sku);
      expect(text).toContain(euro(line.lineTotalCents));
    }
    expect(text).toContain(`Shipping ${euro(3500)}`);
    expect(text).toContain(`Tax at 20 % on goods and shipping ${euro(quote.taxCents)}`);
    expect(text).toContain(`Total ${euro(quote.totalCents)}`);
    // Dates are written for people (en-GB medium, pattern "d MMM y": Unicode CLDR locale data, Unicode Consortium).
    expect(text).toContain('valid until 31 Dec 2098');
    expect(text).toContain('Payment within 30 days of delivery.');
    const [y, mo, d] = quote.earliestDeliveryDate.split('-').map(Number);
    const months = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
    expect(text).toContain(`${d} ${months[mo - 1]} ${y}`);
    expect(text).not.toMatch(/margin|cost/i); // the customer's copy carries no costs or margins
    expect(text).not.toMatch(/build plate|plates|printers|failure|production plan|print days/i); // nor the farm plan
    expect(text).not.toContain(euro(quote.costCents));
  });

  it('continues a long list of lines on a second page with the totals after it', async () => {
    const sales = await suite.t.agent('sales');
    const lines = Array.from({ length: 50 }, (_, i) => ({ sku: FIXTURE_SKUS[i % 2], quantity: i + 1 }));
    const quote = QuoteSchema.parse((await sales.post('/api/quotes').send(body({ lines }))).body);
    const pdf = await sales.get(`/api/quotes/${quote.id}.pdf`).buffer(true).parse(binaryBody);
    const text = pdfText(pdf.body as Buffer);
    expect(text.match(new RegExp(FIXTURE_SKUS[0], 'g'))?.length).toBe(25);
    expect(text).toMatch(/Page 1 of [2-9]/);
  });
});
