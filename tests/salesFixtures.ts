/**
 * Published catalogue variants for the sales tests, built the way the family computation builds them: generate the
 * template, analyse the mesh, estimate production with the default printer, material and rates.
 */
import { analyzeGeometry } from '../shared/analysis/analyzeGeometry';
import { buildPlateFit } from '../shared/analysis/buildPlateFit';
import { assessBirdFit } from '../shared/birdfit/assessBirdFit';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { estimateProduction } from '../shared/production/estimateProduction';
import type { AxisValue, CatalogueVariant } from '../shared/schemas/family';
import { generate } from '../templates/index';

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
    {
      volumeMm3: report.volumeMm3,
      surfaceAreaMm2: report.surfaceAreaMm2,
      heightMm: size[2],
      supportVolumeMm3: report.supportVolumeMm3,
      bboxSizeMm: size,
      footprintMm2: report.footprintMm2,
      upFacingAreaMm2: report.upFacingAreaMm2,
      downFacingAreaMm2: report.downFacingAreaMm2,
    },
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
