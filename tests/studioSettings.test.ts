/**
 * The admin settings: the studio's name, print settings and cost rates, printers and materials live in the database
 * and every reader takes them from there (the built-in defaults only seed it). Bad input answers a sentence and
 * changes nothing. Access rules are our own product decision (no outside source); the figures checked are the
 * values saved, read back.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { smallFamilyBody } from './familiesFixtures';
import { makeTestApp, useTestApp, type TestApp } from './setup/testApp';

const t = useTestApp();

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

/**
 * Removals check and delete in one transaction that locks the profile rows, so requests sent at once take turns.
 * These tests send them at once and check the outcome, not the timing (our own rule: a studio always keeps one
 * printer and one material, and no family names a removed one; no outside source).
 */
/** How many backends of this test database wait for a lock (PostgreSQL). */
async function waitingForLocks(app: TestApp): Promise<number> {
  const { rows } = await app.ctx.pg.query<{ n: number }>(
    "select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'",
  );
  return rows[0].n;
}

/**
 * Sends requests at once. On PostgreSQL the test first locks every row of `table` and lets go only when all the
 * requests wait for those rows, so they meet at the lock every run rather than when the timing happens to fall that
 * way. PGlite runs one transaction at a time (and the test cannot hold one open beside the app's), so there the
 * requests are only sent together.
 * @param app - the test app
 * @param table - the profile table the requests lock
 * @param requests - starts the requests
 */
async function sendTogether<T>(app: TestApp, table: string, requests: () => PromiseLike<T>[]): Promise<T[]> {
  if (app.ctx.pg.engine !== 'postgres') return Promise.all(requests());
  let answers: Promise<T[]> = Promise.resolve([]);
  await app.ctx.db.transaction(async (tx) => {
    await tx.execute(sql.raw(`select id from ${table} for update`));
    const started = requests();
    answers = Promise.all(started);
    while ((await waitingForLocks(app)) < started.length) await new Promise((resolve) => setTimeout(resolve, 20));
  });
  return answers;
}

describe('removals sent at once', () => {
  let only: TestApp;
  const printers = [
    { ...DEFAULT_PRINTERS[0], id: 'wren-a-04', name: 'Wren A 0.4 mm' },
    { ...DEFAULT_PRINTERS[0], id: 'wren-b-04', name: 'Wren B 0.4 mm' },
  ];
  const materials = [
    { ...DEFAULT_MATERIALS[0], id: 'oak-grey', name: 'Oak grey' },
    { ...DEFAULT_MATERIALS[0], id: 'ash-white', name: 'Ash white' },
  ];

  beforeAll(async () => {
    // A studio with no families and exactly two printers and two materials, none of them in use.
    only = await makeTestApp();
    const admin = await only.agent('admin');
    for (const printer of printers)
      expect((await admin.put(`/api/settings/printers/${printer.id}`).send(printer)).status).toBe(201);
    for (const material of materials)
      expect((await admin.put(`/api/settings/materials/${material.id}`).send(material)).status).toBe(201);
    await only.ctx.pg.query('truncate families cascade');
    await only.ctx.pg.query('delete from printer_profiles where id <> all($1)', [printers.map((p) => p.id)]);
    await only.ctx.pg.query('delete from materials where id <> all($1)', [materials.map((m) => m.id)]);
  }, 120_000);

  afterAll(async () => {
    await only?.close();
  });

  const kinds = [
    { kind: 'printer', path: 'printers', table: 'printer_profiles', profiles: printers },
    { kind: 'material', path: 'materials', table: 'materials', profiles: materials },
  ] as const;
  it.each(kinds)(
    'of the only two $path: one is removed, the other refused in words, and the studio keeps one',
    async ({ kind, path, table, profiles }) => {
      const admin = await only.agent('admin');
      const answers = await sendTogether(only, table, () =>
        profiles.map((p) => admin.delete(`/api/settings/${path}/${p.id}`)),
      );
      expect(answers.map((a) => a.status).sort()).toEqual([204, 409]);
      const refused = answers.find((a) => a.status === 409)!;
      expect(refused.body.error.code).toBe(`last_${kind}`);
      const left = (await admin.get('/api/production')).body[path].map((p: { id: string }) => p.id);
      expect(left).toHaveLength(1);
      const kept = profiles.find((p) => p.id === left[0])!;
      expect(refused.body.error.message).toBe(
        `“${kept.name}” is the studio’s only ${kind}: add another before removing it.`,
      );
    },
  );

  it('of one printer twice: one removal, and the other says it is gone', async () => {
    const admin = await only.agent('admin');
    const spare = { ...DEFAULT_PRINTERS[0], id: 'wren-c-04', name: 'Wren C 0.4 mm' };
    expect((await admin.put(`/api/settings/printers/${spare.id}`).send(spare)).status).toBe(201);
    const answers = await sendTogether(only, 'printer_profiles', () =>
      [1, 2].map(() => admin.delete(`/api/settings/printers/${spare.id}`)),
    );
    expect(answers.map((a) => a.status).sort()).toEqual([204, 404]);
    expect(answers.find((a) => a.status === 404)!.body.error.message).toBe(
      'There is no such printer: it may have been removed already.',
    );
  });
});

describe('a family saved while its printer is removed', () => {
  it('either names a printer that stays (the removal refused, naming it) or is refused in words', async () => {
    const admin = await t.agent('admin');
    const designer = await t.agent('designer');
    // The farm printer's figures under a new identifier, so the small test family fits it.
    const farm = DEFAULT_PRINTERS.find((p) => p.id === 'rowan-farm-06')!;
    const spare = { ...farm, id: 'rowan-spare-06', name: 'Rowan spare 0.6 mm' };
    expect((await admin.put(`/api/settings/printers/${spare.id}`).send(spare)).status).toBe(201);

    const body = smallFamilyBody({ name: 'Spare Gable', printerId: spare.id });
    const [saved, removed] = await sendTogether(t, 'printer_profiles', () => [
      designer.post('/api/families').send(body),
      admin.delete(`/api/settings/printers/${spare.id}`),
    ]);
    const printerIds = (await designer.get('/api/production')).body.printers.map((p: { id: string }) => p.id);
    if (saved.status === 201) {
      expect(removed.status).toBe(409);
      expect(removed.body.error.code).toBe('in_use');
      expect(removed.body.error.message).toMatch(/“Spare Gable”/);
      expect(printerIds).toContain(spare.id);
    } else {
      expect(removed.status).toBe(204);
      expect(saved.status).toBe(400);
      expect(saved.body.error.message).toMatch(/^printerId: unknown printer "rowan-spare-06"/);
      expect(printerIds).not.toContain(spare.id);
    }
    // Whichever came first, no family revision names a printer the studio no longer has.
    const { rows } = await t.ctx.pg.query<{ n: number }>(
      'select count(*)::int as n from family_revisions where printer_id not in (select id from printer_profiles)',
    );
    expect(rows[0].n).toBe(0);
  });
});

describe('a family saved while a colour of its material is taken out', () => {
  it('either keeps the colour (the change refused, naming the family) or is refused in words', async () => {
    const admin = await t.agent('admin');
    const designer = await t.agent('designer');
    const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
    const fern = { id: 'fern', name: 'Fern', hex: '#4a6b3a', solarAbsorptance: 0.8 };
    const hazel = { ...pla, id: 'hazel-pla', name: 'Hazel PLA', colours: [...pla.colours, fern] };
    expect((await admin.put(`/api/settings/materials/${hazel.id}`).send(hazel)).status).toBe(201);

    const body = smallFamilyBody({
      name: 'Fern Gable',
      materialId: hazel.id,
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [28] },
        { kind: 'attribute', key: 'colour', values: ['fern'] },
      ],
    });
    const [saved, changed] = await sendTogether(t, 'materials', () => [
      designer.post('/api/families').send(body),
      admin.put(`/api/settings/materials/${hazel.id}`).send({ ...hazel, colours: pla.colours }),
    ]);
    const colours = (await designer.get('/api/production')).body.materials
      .find((m: { id: string }) => m.id === hazel.id)
      .colours.map((c: { id: string }) => c.id);
    if (saved.status === 201) {
      expect(changed.status).toBe(409);
      expect(changed.body.error.message).toMatch(
        /^The colour “Fern” of Hazel PLA cannot be taken out while the family “Fern Gable” uses it/,
      );
      expect(colours).toContain('fern');
    } else {
      expect(changed.status).toBe(200);
      expect(saved.status).toBe(400);
      expect(saved.body.error.message).toMatch(/Hazel PLA does not come in "fern"/);
      expect(colours).not.toContain('fern');
    }
    // Whichever came first, no variant is in a colour its material no longer has.
    const { rows } = await t.ctx.pg.query<{ n: number }>(
      `select count(*)::int as n from family_variants v join materials m on m.id = v.attributes->>'material'
       where v.attributes->>'colour' is not null
         and not exists (select 1 from jsonb_array_elements(m.data->'colours') c where c->>'id' = v.attributes->>'colour')`,
    );
    expect(rows[0].n).toBe(0);
  });
});
