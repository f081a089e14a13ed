/**
 * The admin settings: the studio's name, print settings and cost rates, printers and materials live in the database
 * and every reader takes them from there (the built-in defaults only seed it). Bad input answers a sentence and
 * changes nothing. Access rules are our own product decision (no outside source); the figures checked are the
 * values saved, read back.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { makeTestApp, type TestApp } from './setup/testApp';

let t: TestApp;

beforeAll(async () => {
  t = await makeTestApp();
}, 120_000);

afterAll(async () => {
  await t?.close();
});

describe('studio name', () => {
  it('is read from the database by /api/auth/me, and an admin renames it', async () => {
    const admin = await t.agent('admin');
    const designer = await t.agent('designer');
    expect((await designer.get('/api/auth/me')).body.studioName).toBe('Fernhollow Studio');

    const saved = await admin.put('/api/settings/studio').send({ name: '  Wrenfield Nest Works ' });
    expect(saved.status).toBe(200);
    expect(saved.body).toEqual({ name: 'Wrenfield Nest Works', locale: 'en-GB' });
    expect((await designer.get('/api/auth/me')).body.studioName).toBe('Wrenfield Nest Works');
    expect((await admin.get('/api/settings/studio')).body.name).toBe('Wrenfield Nest Works');
    const shop = await (await t.agent(null)).get('/api/shop/studio');
    expect(shop.body).toEqual({ name: 'Wrenfield Nest Works', locale: 'en-GB' });

    const empty = await admin.put('/api/settings/studio').send({ name: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('Give the studio a name.');
    expect((await admin.get('/api/settings/studio')).body.name).toBe('Wrenfield Nest Works');

    const person = await designer.put('/api/settings/studio').send({ name: 'Not allowed' });
    expect(person.status).toBe(403);
  });
});

describe('print settings and cost rates', () => {
  it('start as the seeded defaults, are saved by an admin and reach the production catalogue', async () => {
    const admin = await t.agent('admin');
    const designer = await t.agent('designer');
    const before = await admin.get('/api/settings/production');
    expect(before.status).toBe(200);
    expect(before.body.settings).toEqual(DEFAULT_SETTINGS);
    expect(before.body.rates).toEqual(DEFAULT_RATES);

    const settings = { ...DEFAULT_SETTINGS, infillPct: 22, perimeters: 3 };
    const rates = { ...DEFAULT_RATES, labourCentsPerHour: 3100, marginPct: 35 };
    const saved = await admin.put('/api/settings/production').send({ settings, rates });
    expect(saved.status).toBe(200);
    expect(saved.body.updatedAt).toEqual(expect.any(String));

    const catalogue = await designer.get('/api/production');
    expect(catalogue.body.settings).toEqual(settings);
    expect(catalogue.body.rates).toEqual(rates);
  });

  it('refuses a margin of 100 % with a sentence and keeps what was saved', async () => {
    const admin = await t.agent('admin');
    const before = (await admin.get('/api/settings/production')).body;
    const bad = await admin
      .put('/api/settings/production')
      .send({ settings: before.settings, rates: { ...before.rates, marginPct: 100 } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^Margin \(%\)/);
    expect(bad.body.error.message).not.toMatch(/marginPct|Too big|expected/);
    expect((await admin.get('/api/settings/production')).body).toEqual(before);
  });
});

describe('printers and materials', () => {
  it('makes a printer added by an admin pickable everywhere the production catalogue is read', async () => {
    const admin = await t.agent('admin');
    const printer = { ...DEFAULT_PRINTERS[0], id: 'hazel-tall-04', name: 'Hazel tall 0.4 mm', nozzleMm: 0.4 };
    const added = await admin.put(`/api/settings/printers/${printer.id}`).send(printer);
    expect(added.status).toBe(201);
    const changed = await admin.put(`/api/settings/printers/${printer.id}`).send({ ...printer, averagePowerW: 120 });
    expect(changed.status).toBe(200);

    const catalogue = await (await t.agent('designer')).get('/api/production');
    const found = catalogue.body.printers.find((p: { id: string }) => p.id === printer.id);
    expect(found).toMatchObject({ name: 'Hazel tall 0.4 mm', averagePowerW: 120 });
  });

  it('refuses an identifier that does not match the address, and a layer range that excludes the layer height', async () => {
    const admin = await t.agent('admin');
    const printer = DEFAULT_PRINTERS[0];
    const renamed = await admin.put(`/api/settings/printers/${printer.id}`).send({ ...printer, id: 'other-id' });
    expect(renamed.status).toBe(400);
    expect(renamed.body.error.message).toMatch(/identifier cannot be changed/);
    const range = await admin
      .put(`/api/settings/printers/${printer.id}`)
      .send({ ...printer, layerHeightMm: 0.3, minLayerHeightMm: 0.35 });
    expect(range.status).toBe(400);
    expect(range.body.error.message).toMatch(/thinnest layer/);
  });

  it('saves a material with a new colour, and refuses two colours with one identifier', async () => {
    const admin = await t.agent('admin');
    const base = DEFAULT_MATERIALS[0];
    const fern = { id: 'fern', name: 'Fern', hex: '#4a6b3a', solarAbsorptance: 0.8 };
    const saved = await admin
      .put(`/api/settings/materials/${base.id}`)
      .send({ ...base, colours: [...base.colours, fern] });
    expect(saved.status).toBe(200);
    const catalogue = await (await t.agent('designer')).get('/api/production');
    const material = catalogue.body.materials.find((m: { id: string }) => m.id === base.id);
    expect(material.colours.map((c: { id: string }) => c.id)).toContain('fern');

    const twice = await admin
      .put(`/api/settings/materials/${base.id}`)
      .send({ ...base, colours: [...base.colours, fern, fern] });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toMatch(/Two colours share the identifier “fern”/);

    const badHex = await admin
      .put(`/api/settings/materials/${base.id}`)
      .send({ ...base, colours: [{ ...fern, hex: 'green' }] });
    expect(badHex.status).toBe(400);
    expect(badHex.body.error.message).not.toMatch(/regex|Invalid/);
  });
});
