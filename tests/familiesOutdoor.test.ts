/**
 * Outdoor fitness in families: every computed variant stores the sol-air roof and wall temperatures of its material
 * and colour, and a surface above the material's heat-deflection temperature blocks the gate until a designer
 * acknowledges it in writing. Expected temperatures are the values of the ASHRAE sol-air
 * formula (ASHRAE Handbook—Fundamentals); PLA's heat-deflection temperature is from the NatureWorks Ingeo 2003D data sheet.
 */
import { afterAll, describe, expect, it } from 'vitest';
import type { Variant } from '../shared/schemas/variant';
import type { Family } from '../shared/schemas/family';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { computeNow, createTestFamily, smallFamilyBody } from './familiesFixtures';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
afterAll(async () => {
  await familyJobs(t.ctx).close();
});

describe('outdoor heat in the family gate', () => {
  it('flags black PLA variants above the heat-deflection temperature, blocks the gate until acknowledged, passes white', async () => {
    const family = await createTestFamily(
      t,
      smallFamilyBody({
        axes: [
          { kind: 'param', key: 'entryHoleDiameterMm', values: [28] },
          { kind: 'attribute', key: 'colour', values: ['white', 'black'] },
        ],
        materialId: 'pla',
      }),
    );
    await computeNow(t, family.id);
    const designer = await t.agent('designer');
    const list = await designer.get(`/api/families/${family.id}/variants?pageSize=50`);
    expect(list.status).toBe(200);
    const variants = list.body.variants as Variant[];
    const white = variants.find((v) => v.attributes.colour === 'white')!;
    const black = variants.find((v) => v.attributes.colour === 'black')!;
    expect(white.status, white.error ?? '').toBe('done');
    expect(black.status, black.error ?? '').toBe('done');

    // source: ASHRAE sol-air worked values — h_o 17, air 30 °C; roof 1000 W/m² − 3.9 K,
    // wall 600 W/m²: α 0.25 roof 40.8 °C, wall 38.8 °C; α 0.95 roof 82.0 °C, wall 63.5 °C
    // (white 0.25 and black 0.95 are the absorptances of shared/production/defaults.ts; solar absorptance table, scirp.org paper 88555)
    expect(white.report!.outdoor!.roof.solAirC).toBeCloseTo(40.8, 1);
    expect(white.report!.outdoor!.wall.solAirC).toBeCloseTo(38.8, 1);
    expect(black.report!.outdoor!.roof.solAirC).toBeCloseTo(82.0, 1);
    expect(black.report!.outdoor!.wall.solAirC).toBeCloseTo(63.5, 1);
    // source: Ingeo 2003D heat distortion at 0.45 MPa — PLA 55 °C
    expect(black.report!.outdoor!.heatDeflectionC).toBe(55);
    expect(black.report!.outdoor!.wallResistance?.ratioToPine).toBeGreaterThan(0);

    expect(black.reasons).toContain("roof in full sun reaches 82 °C, above PLA's 55 °C");
    expect(black.reasons).toContain("wall in full sun reaches 64 °C, above PLA's 55 °C");
    expect(black.verdict).toBe('warn');
    expect(white.reasons.some((r) => /full sun/.test(r))).toBe(false);

    let current = (await designer.get(`/api/families/${family.id}`)).body.family as Family;
    const heat = current.gate.warnings.find((w) => w.code === 'outdoor-heat');
    expect(heat?.severity).toBe('warning');
    expect(heat?.skus).toEqual([black.sku]);
    expect(heat?.message).toMatch(/82\.0 °C/);
    const blocker = current.gate.blockers.find((b) => b.code === 'outdoor_unacknowledged');
    expect(blocker?.skus).toEqual([black.sku]);

    // Acknowledge the bird-fit warnings only: the heat warning still blocks.
    const birdCodes = current.gate.warnings
      .filter((w) => w.severity === 'warning' && w.code !== 'outdoor-heat')
      .map((w) => w.code);
    if (birdCodes.length > 0) {
      const res = await designer
        .post(`/api/families/${family.id}/acknowledgements`)
        .send({ acknowledgements: birdCodes.map((code) => ({ code, text: `Reviewed ${code} for the test family.` })) });
      expect(res.status).toBe(200);
      current = res.body.family as Family;
    }
    expect(current.gate.ok).toBe(false);
    expect(current.gate.blockers.map((b) => b.code)).toEqual(['outdoor_unacknowledged']);
    let submit = await designer.post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status).toBe(409);
    expect(submit.body.error.details.blockers.map((b: { code: string }) => b.code)).toContain('outdoor_unacknowledged');

    const tooShort = await designer
      .post(`/api/families/${family.id}/acknowledgements`)
      .send({ acknowledgements: [{ code: 'outdoor-heat', text: 'shade' }] });
    expect(tooShort.status).toBe(400);

    const ack = await designer.post(`/api/families/${family.id}/acknowledgements`).send({
      acknowledgements: [{ code: 'outdoor-heat', text: 'Black listings say: hang in shade, facing north to east.' }],
    });
    expect(ack.status, JSON.stringify(ack.body)).toBe(200);
    current = ack.body.family as Family;
    expect(current.gate.warnings.find((w) => w.code === 'outdoor-heat')?.acknowledgement?.by.name).toBe('Maren Hale');
    expect(current.gate.ok).toBe(true);
    submit = await designer.post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status, JSON.stringify(submit.body)).toBe(200);
  });

  it('lets a white-only PLA family through without an outdoor-heat warning', async () => {
    const family = await createTestFamily(
      t,
      smallFamilyBody({
        axes: [
          { kind: 'param', key: 'entryHoleDiameterMm', values: [28] },
          { kind: 'attribute', key: 'colour', values: ['white'] },
        ],
      }),
    );
    await computeNow(t, family.id);
    const current = (await (await t.agent('designer')).get(`/api/families/${family.id}`)).body.family as Family;
    // source: ASHRAE sol-air formula; NatureWorks Ingeo 2003D data sheet — white roof 40.8 °C stays under PLA's 55 °C by more than the 10 K caution margin
    expect(current.gate.warnings.some((w) => w.code === 'outdoor-heat')).toBe(false);
    expect(current.gate.blockers.some((b) => b.code === 'outdoor_unacknowledged')).toBe(false);
  });

  it('seeds the demo families with dark colours through their gate, outdoor-heat acknowledged in writing', async () => {
    const designer = await t.agent('designer');
    const list = await designer.get('/api/families');
    expect(list.status).toBe(200);
    const seeded = (list.body.families as Array<{ id: string; code: string; state: string }>).filter((f) =>
      ['HGB', 'CAF'].includes(f.code),
    );
    expect(seeded.length).toBe(2);
    for (const summary of seeded) {
      expect(summary.state).not.toBe('draft');
      const family = (await designer.get(`/api/families/${summary.id}`)).body.family as Family;
      // source: ASHRAE sol-air formula with moss green α 0.65 (roof 64.3 °C) and bark brown α 0.80 (roof 73.2 °C),
      // both above PLA's 55 °C (NatureWorks Ingeo 2003D data sheet)
      const heat = family.gate.warnings.find((w) => w.code === 'outdoor-heat');
      expect(heat?.acknowledgement?.text.length).toBeGreaterThanOrEqual(10);
      expect(family.gate.ok).toBe(true);
    }
  });
});
