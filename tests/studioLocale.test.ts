/**
 * The studio's locale and the settings screen's removals and new edits:
 * - the locale is a studio setting (en-GB until changed), returned by /api/auth/me and the public /api/shop/studio,
 *   refused in words when the runtime does not know it, and used by documents (order mails) for money;
 * - a printer, a material, a colour or a finish a family uses cannot be removed (409 in words naming the family);
 *   one no family uses is removed;
 * - the sales settings' divisors, quantity breaks, shop and workshop address are saved, and refused in words.
 * Expected amounts are written by hand from Unicode CLDR locale data (Unicode Consortium; the release the runtime's
 * ICU carries): German
 * "#,##0.00 ¤" with "." grouping, "," decimals and a no-break space before the sign; French with a narrow no-break
 * space grouping; British English "¤#,##0.00". Access rules and the refusals are our own product decisions.
 */
import { describe, expect, it } from 'vitest';
import { formatMoney } from '../shared/format';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS } from '../shared/production/defaults';
import { orderMail } from '../server/services/orderMail';
import { eq, sql } from 'drizzle-orm';
import { familyRevisions, familyVariants, type OrderLineRow, type OrderRow } from '../server/db/schema';
import { useTestApp } from './setup/testApp';

const t = useTestApp();

const NBSP = '\u00a0';
const NNBSP = '\u202f';

describe('money in a locale (Unicode CLDR)', () => {
  it('writes 1234.50 euros the German, French and British way', () => {
    expect(formatMoney(123450, 'EUR', 'de-DE')).toBe(`1.234,50${NBSP}€`);
    expect(formatMoney(123450, 'EUR', 'fr-FR')).toBe(`1${NNBSP}234,50${NBSP}€`);
    expect(formatMoney(123450, 'EUR', 'en-GB')).toBe('€1,234.50');
    // Yen have no minor unit (ISO 4217): 500 minor units are 500 yen.
    expect(formatMoney(500, 'JPY', 'de-DE')).toBe(`500${NBSP}¥`);
  });

  it('is used by an order mail when the studio’s locale is passed', () => {
    const row = {
      number: 42,
      email: 'wren@example.org',
      currency: 'EUR',
      totalMinor: 123450,
      siteOrigin: 'https://shop.example.org',
      customerToken: 'token',
      shipTo: {
        name: 'Ada Wren',
        line1: '1 Lane',
        line2: '',
        city: 'Town',
        region: '',
        postalCode: 'AB1 2CD',
        country: 'GB',
      },
    } as unknown as OrderRow;
    const german = orderMail(row, 'paid', [] as OrderLineRow[], 'Fernhollow Studio', 'de-DE');
    expect(german?.text).toContain(`1.234,50${NBSP}€`);
    const british = orderMail(row, 'paid', [] as OrderLineRow[], 'Fernhollow Studio', 'en-GB');
    expect(british?.text).toContain('€1,234.50');
  });
});

describe('the studio locale', () => {
  it('is en-GB until an admin changes it; /api/auth/me and the shop then answer the new one', async () => {
    const admin = await t.agent('admin');
    const designer = await t.agent('designer');
    const shopper = await t.agent(null);
    expect((await designer.get('/api/auth/me')).body.locale).toBe('en-GB');
    expect((await shopper.get('/api/shop/studio')).body.locale).toBe('en-GB');

    const name = (await admin.get('/api/settings/studio')).body.name;
    const saved = await admin.put('/api/settings/studio').send({ name, locale: 'de-DE' });
    expect(saved.status).toBe(200);
    expect(saved.body).toEqual({ name, locale: 'de-DE' });
    expect((await designer.get('/api/auth/me')).body.locale).toBe('de-DE');
    expect((await shopper.get('/api/shop/studio')).body).toEqual({ name, locale: 'de-DE' });

    // A rename alone keeps the locale.
    await admin.put('/api/settings/studio').send({ name: `${name} ` });
    expect((await admin.get('/api/settings/studio')).body.locale).toBe('de-DE');
  });

  it('refuses a locale the runtime does not know, in words, and keeps the saved one', async () => {
    const admin = await t.agent('admin');
    const before = (await admin.get('/api/settings/studio')).body;
    const bad = await admin.put('/api/settings/studio').send({ name: before.name, locale: 'zz-QQ' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('This language and region is not known here: choose one from the list.');
    expect((await admin.get('/api/settings/studio')).body).toEqual(before);
    const designer = await t.agent('designer');
    expect((await designer.put('/api/settings/studio').send({ name: 'X', locale: 'en-US' })).status).toBe(403);
  });
});

/** The seeded families' printer and material, and a variant's colour and finish (read from the database). */
async function usedBySeededFamily(): Promise<{
  family: string;
  printerId: string;
  materialId: string;
  colour: string;
  finish: string;
}> {
  const [row] = await t.ctx.db
    .select({
      name: familyRevisions.name,
      printerId: familyRevisions.printerId,
      materialId: familyRevisions.materialId,
      attributes: familyVariants.attributes,
    })
    .from(familyVariants)
    .innerJoin(familyRevisions, eq(familyVariants.revisionId, familyRevisions.id))
    .where(
      sql`${familyVariants.attributes}->>'colour' is not null and ${familyVariants.attributes}->>'finish' is not null`,
    )
    .limit(1);
  if (!row) throw new Error('The seed has no family variant with a colour and a finish.');
  return {
    family: row.name,
    printerId: row.printerId,
    materialId: row.materialId,
    colour: row.attributes.colour ?? '',
    finish: row.attributes.finish ?? '',
  };
}

describe('removing printers, materials, colours and finishes', () => {
  it('refuses, naming the family, while a family uses the printer or the material', async () => {
    const admin = await t.agent('admin');
    const used = await usedBySeededFamily();
    const printer = await admin.delete(`/api/settings/printers/${used.printerId}`);
    expect(printer.status).toBe(409);
    expect(printer.body.error.message).toMatch(/^The printer “.+” cannot be removed while/);
    expect(printer.body.error.message).toContain(`“${used.family}”`);
    const material = await admin.delete(`/api/settings/materials/${used.materialId}`);
    expect(material.status).toBe(409);
    expect(material.body.error.message).toMatch(/^The material “.+” cannot be removed while/);
    const catalogue = (await admin.get('/api/production')).body;
    expect(catalogue.printers.map((p: { id: string }) => p.id)).toContain(used.printerId);
    expect(catalogue.materials.map((m: { id: string }) => m.id)).toContain(used.materialId);
  });

  it('refuses to take out a colour or a finish a family’s variants use', async () => {
    const admin = await t.agent('admin');
    const used = await usedBySeededFamily();
    const catalogue = (await admin.get('/api/production')).body;
    const material = catalogue.materials.find((m: { id: string }) => m.id === used.materialId);
    const withoutColour = {
      ...material,
      colours: material.colours.filter((c: { id: string }) => c.id !== used.colour),
    };
    const colour = await admin.put(`/api/settings/materials/${material.id}`).send(withoutColour);
    expect(colour.status).toBe(409);
    expect(colour.body.error.message).toMatch(/^The colour “.+” of .+ cannot be taken out while/);

    const stored = (await admin.get('/api/settings/production')).body;
    const finishes = stored.rates.finishes.filter((f: { id: string }) => f.id !== used.finish);
    const finish = await admin
      .put('/api/settings/production')
      .send({ settings: stored.settings, rates: { ...stored.rates, finishes } });
    expect(finish.status).toBe(409);
    expect(finish.body.error.message).toMatch(/^The finish “.+” cannot be taken out while/);
    expect((await admin.get('/api/settings/production')).body).toEqual(stored);
  });

  it('removes a printer and a material no family uses, and says when there is none', async () => {
    const admin = await t.agent('admin');
    const printer = { ...DEFAULT_PRINTERS[0], id: 'alder-spare-02', name: 'Alder spare' };
    expect((await admin.put(`/api/settings/printers/${printer.id}`).send(printer)).status).toBe(201);
    const material = { ...DEFAULT_MATERIALS[0], id: 'spare-blend', name: 'Spare blend' };
    expect((await admin.put(`/api/settings/materials/${material.id}`).send(material)).status).toBe(201);

    expect((await admin.delete(`/api/settings/printers/${printer.id}`)).status).toBe(204);
    expect((await admin.delete(`/api/settings/materials/${material.id}`)).status).toBe(204);
    const catalogue = (await admin.get('/api/production')).body;
    expect(catalogue.printers.map((p: { id: string }) => p.id)).not.toContain(printer.id);
    expect(catalogue.materials.map((m: { id: string }) => m.id)).not.toContain(material.id);

    const again = await admin.delete(`/api/settings/printers/${printer.id}`);
    expect(again.status).toBe(404);
    expect(again.body.error.message).toBe('There is no such printer: it may have been removed already.');
  });
});

describe('the sales settings the screen now edits', () => {
  it('saves quantity breaks, a new divisor the shop uses, the shop and the workshop address', async () => {
    const admin = await t.agent('admin');
    const { settings } = (await admin.get('/api/settings/sales')).body;
    const divisor = {
      id: 'metric-4000',
      label: 'Courier, within Europe',
      unitSystem: 'metric',
      divisor: 4000,
      effectiveFrom: '2026-01-01',
      appliesAboveVolume: 0,
      source: 'Our own courier contract (invented for the demo studio).',
    };
    const next = {
      ...settings,
      dimDivisors: [...settings.dimDivisors, divisor],
      quantityBreaks: [
        { minQuantity: 10, discountPct: 5 },
        { minQuantity: 50, discountPct: 12 },
      ],
      shop: {
        ...settings.shop,
        vatRatePct: 19,
        shipping: { ...settings.shop.shipping, divisorId: 'metric-4000' },
      },
      workshopAddress: { ...settings.workshopAddress, line1: '3 Bramble Yard', postalCode: 'FH2 9QT' },
    };
    const saved = await admin.put('/api/settings/sales').send(next);
    expect(saved.status).toBe(200);
    const read = (await admin.get('/api/settings/sales')).body.settings;
    expect(read.quantityBreaks).toEqual(next.quantityBreaks);
    expect(read.dimDivisors).toContainEqual(divisor);
    expect(read.shop.vatRatePct).toBe(19);
    expect(read.shop.shipping.divisorId).toBe('metric-4000');
    expect(read.workshopAddress.line1).toBe('3 Bramble Yard');
  });

  it('refuses in words: a divisor the shop uses taken out, breaks out of order, VAT over 50 %, no postcode', async () => {
    const admin = await t.agent('admin');
    const before = (await admin.get('/api/settings/sales')).body;
    const { settings } = before;
    const put = (body: object) => admin.put('/api/settings/sales').send(body);

    const divisor = await put({
      ...settings,
      dimDivisors: settings.dimDivisors.filter((d: { id: string }) => d.id !== settings.shop.shipping.divisorId),
    });
    expect(divisor.status).toBe(400);
    expect(divisor.body.error.message).toMatch(/^The shop’s shipping table needs one of the shipping divisors/);

    const breaks = await put({
      ...settings,
      quantityBreaks: [
        { minQuantity: 50, discountPct: 12 },
        { minQuantity: 10, discountPct: 5 },
      ],
    });
    expect(breaks.status).toBe(400);
    expect(breaks.body.error.message).toBe('List the quantity breaks from the smallest quantity to the largest.');

    const vat = await put({ ...settings, shop: { ...settings.shop, vatRatePct: 80 } });
    expect(vat.status).toBe(400);
    expect(vat.body.error.message).toBe('VAT rate (%) must be 50 or less.');

    const address = await put({ ...settings, workshopAddress: { ...settings.workshopAddress, postalCode: '' } });
    expect(address.status).toBe(400);
    expect(address.body.error.message).toBe('Postcode is required.');

    expect((await admin.get('/api/settings/sales')).body).toEqual(before);
  });
});
