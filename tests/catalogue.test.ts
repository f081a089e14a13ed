/**
 * The published catalogue: only variants of published revisions, readable by sales, catalogue managers and
 * designers, with what a spec sheet needs; `getVariantBySku` for other features. The seeded demo families are
 * Hedgerow Gable (HGB, published, 12 variants), Copse A-frame (CAF, in review) and Meadow Gable (MGB, draft).
 */
import { describe, expect, it } from 'vitest';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import { DEFAULT_RATES } from '../shared/production/defaults';
import { getVariantBySku, listCatalogueVariants } from '../server/services/catalogue';
import { findTemplate } from '../templates/index';
import { useTestApp } from './setup/testApp';

const t = useTestApp();

describe('GET /api/catalogue', () => {
  it('lists every published variant and nothing in review or draft', async () => {
    const res = await (await t.agent('sales')).get('/api/catalogue');
    expect(res.status).toBe(200);
    const variants = res.body.variants as CatalogueVariant[];
    const codes = new Set(variants.map((v) => v.family.code));
    expect([...codes]).toEqual(['HGB']);
    // 3 entries × 2 trims × 2 colours = 12 (arithmetic)
    expect(variants).toHaveLength(12);
    expect(new Set(variants.map((v) => v.sku)).size).toBe(12);
    for (const v of variants) {
      expect(v.revision).toBe(1);
      expect(v.templateId).toBe('gable-box');
      expect(v.report.watertight).toBe(true);
      expect(v.report.fitsPrinter).toBe(true);
      expect(v.report.supportVolumeMm3).toBeLessThanOrEqual(12_000);
      expect(v.priceCents).toBe(v.cost.suggestedPriceCents);
      // suggested price = cost / (1 − margin), rounded (the studio's rate; arithmetic)
      expect(v.priceCents).toBeCloseTo(v.cost.costCents / (1 - DEFAULT_RATES.marginPct / 100), -1);
      expect(v.acknowledgements.map((a) => a.code)).toContain('thin-walls');
    }
  });

  it('filters by colour, material and search text', async () => {
    const sales = await t.agent('sales');
    const moss = (await sales.get('/api/catalogue?colour=moss-green')).body.variants as CatalogueVariant[];
    expect(moss).toHaveLength(6);
    expect(moss.every((v) => v.attributes.colour === 'moss-green')).toBe(true);
    const search = (await sales.get('/api/catalogue?q=hgb-28')).body.variants as CatalogueVariant[];
    expect(search.map((v) => v.sku).sort()).toEqual([
      'FH-HGB-28-NONE-MOSS',
      'FH-HGB-28-NONE-SAND',
      'FH-HGB-28-SHIN-MOSS',
      'FH-HGB-28-SHIN-SAND',
    ]);
    expect(((await sales.get('/api/catalogue?material=petg')).body.variants as unknown[]).length).toBe(0);
  });

  it('is closed to signed-out callers and admins without a catalogue role', async () => {
    expect((await (await t.agent(null)).get('/api/catalogue')).status).toBe(401);
    expect((await (await t.agent('admin')).get('/api/catalogue')).status).toBe(403);
    expect((await (await t.agent('designer')).get('/api/catalogue')).status).toBe(200);
  });
});

describe('catalogue service for spec sheets and quotes', () => {
  it('gives one variant by SKU with family, template, parameters, attributes, facts, report and cost', async () => {
    const variant = await getVariantBySku(t.ctx, 'FH-HGB-25-NONE-SAND');
    expect(variant).toBeDefined();
    expect(variant!.family).toMatchObject({ code: 'HGB', name: 'Hedgerow Gable' });
    expect(variant!.templateVersion).toBe(findTemplate('gable-box')?.version); // the seeded family's template, current version
    expect(variant!.attributes).toEqual({ colour: 'sand', material: 'pla', finish: null });
    expect(variant!.params).toMatchObject({ entryHoleDiameterMm: 25, trimStyle: 'none', cavityDepthMm: 160 });
    // source: RSPB — blue tit hole 25 mm; the box reports the hole it was built with
    expect(variant!.report.facts.entryHoleDiameterMm).toBeCloseTo(25, 1);
    expect(variant!.report.massG).toBeGreaterThan(0);
    expect(variant!.cost.breakdown.totalCents).toBe(variant!.cost.costCents);
    expect(await getVariantBySku(t.ctx, 'FH-CAF-28-SAND')).toBeUndefined();
    expect(await getVariantBySku(t.ctx, 'FH-NOPE')).toBeUndefined();
  });

  it('lists by SKU set and family', async () => {
    const two = await listCatalogueVariants(t.ctx, {
      skus: ['FH-HGB-32-SHIN-MOSS', 'FH-HGB-25-NONE-SAND', 'FH-CAF-28-SAND'],
    });
    expect(two.map((v) => v.sku).sort()).toEqual(['FH-HGB-25-NONE-SAND', 'FH-HGB-32-SHIN-MOSS']);
    expect(await listCatalogueVariants(t.ctx, { skus: [] })).toEqual([]);
    const byFamily = await listCatalogueVariants(t.ctx, { familyId: two[0].family.id });
    expect(byFamily).toHaveLength(12);
  });
});
