/**
 * `GET /api/production`: the design editor's printers and materials come from the database (a changed row shows),
 * checked by the shared schemas, with the print settings and cost rates in force. Access is in tests/authz.test.ts.
 */
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { ProductionCatalogueSchema } from '../shared/schemas/production';
import { DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { materials } from '../server/db/schema';
import { useTestApp } from './setup/testApp';

const t = useTestApp();

describe('GET /api/production', () => {
  it('answers the seeded printers and materials with their sourced properties', async () => {
    const res = await (await t.agent('sales')).get('/api/production');
    expect(res.status).toBe(200);
    const catalogue = ProductionCatalogueSchema.parse(res.body);
    expect(catalogue.printers.length).toBeGreaterThanOrEqual(1);
    const pla = catalogue.materials.find((item) => item.id === 'pla');
    // source: NatureWorks Ingeo 2003D — heat distortion at 0.45 MPa 55 °C
    expect(pla?.heatDeflectionC).toBeCloseTo(55, 0);
    // source: NatureWorks Ingeo 4043D — density 1.24 g/cm³
    expect(pla?.densityGcm3).toBeCloseTo(1.24, 2);
    // source: solar absorptance table, scirp.org paper 88555 — soot 0.95, black paint 0.975; white enamel 0.252
    expect(pla?.colours.find((c) => c.id === 'black')?.solarAbsorptance).toBeGreaterThanOrEqual(0.9);
    expect(pla?.colours.find((c) => c.id === 'white')?.solarAbsorptance).toBeLessThanOrEqual(0.3);
    // No stored settings or rates yet: the defaults apply.
    expect(catalogue.settings).toEqual(DEFAULT_SETTINGS);
    expect(catalogue.rates).toEqual(DEFAULT_RATES);
  });

  it('reads the database, not the built-in list: a material changed in the table is answered changed', async () => {
    const [row] = await t.ctx.db.select().from(materials).where(eq(materials.id, 'pla'));
    expect(row).toBeDefined();
    await t.ctx.db
      .update(materials)
      .set({ name: 'PLA (studio stock)', data: { ...(row!.data as object), priceCentsPerKg: 1999 } })
      .where(eq(materials.id, 'pla'));
    const res = await (await t.agent('designer')).get('/api/production');
    expect(res.status).toBe(200);
    const pla = ProductionCatalogueSchema.parse(res.body).materials.find((item) => item.id === 'pla');
    expect(pla?.name).toBe('PLA (studio stock)');
    expect(pla?.priceCentsPerKg).toBe(1999);
  });

  it('is closed to people who are not signed in', async () => {
    const res = await (await t.agent(null)).get('/api/production');
    expect(res.status).toBe(401);
  });
});
