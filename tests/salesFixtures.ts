/**
 * Published catalogue variants for the sales tests, built the way the family computation builds them: generate the
 * template, analyse the mesh, estimate production with the default printer, material and rates.
 */
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { buildPlateFit } from '../shared/analysis/buildPlateFit';
import { assessBirdFit } from '../shared/birdfit/assessBirdFit';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { estimateProduction } from '../shared/production/estimateProduction';
import { productionInputFromGeometry } from '../shared/production/productionInputFromGeometry';
import type { AxisValue } from '../shared/schemas/familySpec';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import { generate } from '../templates/index';
import type { Db } from '../server/db/client';
import { families, familyRevisions, familyVariants } from '../server/db/schema';
import { demoPersonId } from '../server/db/seedDemo';

/** What differs between fixture variants. */
export interface FixtureSpec {
  sku: string;
  templateId: string;
  familyName?: string;
  axisValues?: Record<string, AxisValue>;
  params?: Record<string, AxisValue>;
  colour?: string;
  /** Price in cents; the suggested price when omitted. */
  priceCents?: number;
}

/**
 * A published variant with a real report and cost.
 * @param spec - SKU, template, parameters and colour
 */
export async function catalogueVariantFixture(spec: FixtureSpec): Promise<CatalogueVariant> {
  const result = await generate(spec.templateId, { ...spec.params });
  const printer = DEFAULT_PRINTERS[0];
  const { report } = analyzeGeometry(result.mesh, { up: '+z', supportMaxRays: 20_000, wallSamples: 500 });
  const size = report.bbox.sizeMm;
  const production = estimateProduction(
    productionInputFromGeometry(report),
    printer,
    DEFAULT_MATERIALS[0],
    DEFAULT_SETTINGS,
    DEFAULT_RATES,
  );
  const fit = buildPlateFit(size, [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z]);
  const params = result.params as Record<string, AxisValue>;
  return {
    sku: spec.sku,
    variantKey: JSON.stringify(spec.axisValues ?? {}),
    axisValues: spec.axisValues ?? {},
    params,
    attributes: { colour: spec.colour ?? 'sand', material: 'pla', finish: null },
    sha256: result.sha256,
    verdict: 'pass',
    birdFitWarnings: assessBirdFit(result.facts).warnings,
    family: { id: `family-${spec.templateId}`, code: 'TST', name: spec.familyName ?? 'Test family', description: '' },
    revision: 1,
    templateId: spec.templateId,
    templateVersion: result.template.version,
    report: {
      triangles: report.triangles,
      volumeMm3: report.volumeMm3,
      surfaceAreaMm2: report.surfaceAreaMm2,
      watertight: report.watertight,
      openEdges: 0,
      nonManifoldEdges: 0,
      components: report.components,
      partCount: result.partCount,
      bboxSizeMm: size,
      overhangAreaMm2: report.overhang.areaMm2,
      supportVolumeMm3: report.supportVolumeMm3,
      maxBridgeSpanMm: 0,
      thinnestWallMm: null,
      printerId: printer.id,
      fitsPrinter: fit.fits,
      copiesPerPlate: fit.copiesPerPlate,
      massG: production.massG,
      filamentLengthM: production.filamentLengthM,
      printTimeMin: production.printTimeMin,
      facts: result.facts,
      warnings: [],
      targetChecks: [],
    },
    cost: {
      currency: production.currency,
      costCents: production.cost.totalCents,
      breakdown: production.cost,
      suggestedPriceCents: production.suggestedPriceCents,
    },
    priceCents: spec.priceCents ?? production.suggestedPriceCents,
    currency: production.currency,
    acknowledgements: [],
    photos: [],
    publishedAt: '2026-11-30T10:00:00.000Z',
  };
}

/**
 * Writes variants into the family tables as one published family (revision 1, state published, every variant done),
 * so the catalogue service lists them. Returns the family id.
 * @param db - the test database
 * @param variants - fixture variants (their family code and name are used)
 * @param ownerId - the designer who owns the family
 */
export async function publishFixtureFamily(db: Db, variants: CatalogueVariant[], ownerId: string): Promise<string> {
  const first = variants[0];
  const [family] = await db
    .insert(families)
    .values({ code: first.family.code, ownerId, currentRevision: 1, publishedRevision: 1 })
    .returning();
  const [revision] = await db
    .insert(familyRevisions)
    .values({
      familyId: family.id,
      number: 1,
      state: 'published',
      name: first.family.name,
      description: first.family.description,
      templateId: first.templateId,
      templateVersion: first.templateVersion,
      baseParams: {},
      axes: [],
      supportBudgetMm3: 1_000_000,
      printerId: first.report.printerId,
      materialId: first.attributes.material,
      computeState: 'done',
      publishedAt: new Date(first.publishedAt),
    })
    .returning();
  await db.insert(familyVariants).values(
    variants.map((variant, index) => ({
      revisionId: revision.id,
      index,
      sku: variant.sku,
      variantKey: variant.variantKey,
      axisValues: variant.axisValues,
      params: variant.params,
      attributes: variant.attributes,
      status: 'done' as const,
      sha256: variant.sha256,
      report: variant.report,
      cost: variant.cost,
      verdict: variant.verdict,
      birdFitWarnings: variant.birdFitWarnings,
    })),
  );
  return family.id;
}

const seeded = new WeakMap<object, Promise<SalesFixture>>();

/** What {@link ensureSalesFixture} put in a test database. */
export interface SalesFixture {
  familyId: string;
  variants: CatalogueVariant[];
}

/** SKUs of the fixture family (a gable box with 28 and 32 mm entries, sand and moss green). */
export const FIXTURE_SKUS = ['FH-TSG-28-SAND', 'FH-TSG-32-MOSS'] as const;

/**
 * Publishes the fixture family once per database (later calls return the same promise).
 * @param db - the test database
 */
export function ensureSalesFixture(db: Db): Promise<SalesFixture> {
  let pending = seeded.get(db);
  if (!pending) {
    pending = (async () => {
      const variants = [
        await catalogueVariantFixture({
          sku: FIXTURE_SKUS[0],
          templateId: 'gable-box',
          familyName: 'Hedgerow Gable, "test" edition',
          axisValues: { entryHoleDiameterMm: 28, colour: 'sand' },
          params: { entryHoleDiameterMm: 28, cavityDepthMm: 200 },
          colour: 'sand',
        }),
        await catalogueVariantFixture({
          sku: FIXTURE_SKUS[1],
          templateId: 'gable-box',
          familyName: 'Hedgerow Gable, "test" edition',
          axisValues: { entryHoleDiameterMm: 32, colour: 'moss-green' },
          params: { entryHoleDiameterMm: 32, cavityDepthMm: 200 },
          colour: 'moss-green',
        }),
      ];
      for (const v of variants) v.family.code = 'TSG';
      const familyId = await publishFixtureFamily(db, variants, await demoPersonId(db, 'designer'));
      for (const v of variants) v.family.id = familyId;
      return { familyId, variants };
    })();
    seeded.set(db, pending);
  }
  return pending;
}
