/** Gathers what a spec sheet shows for a published variant and renders it; its cautions are in `specSheetCautions.ts`. */
import { assessBirdFit } from '../../shared/birdfit/assessBirdFit';
import { SPECIES } from '../../shared/birdfit/species';
import { orthographicDrawing } from '../../shared/drawing/orthographicDrawing';
import { shadedViewSvg } from '../../shared/drawing/shadedViewSvg';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { Material } from '../../shared/schemas/production';
import type { SalesSettings } from '../../shared/schemas/sales';
import { dimensionalWeight } from '../../shared/shipping/dimensionalWeight';
import { shippingBox } from '../../shared/shipping/shippingBox';
import { pdfText } from '../pdf/pdfFonts';
import { renderSpecSheetsPdf, type SpecSheetInput } from '../pdf/specSheetPdf';
import { productMeshInWorker } from '../workers/ProductMeshWorker';
import { findTemplate, TemplateParamError } from '../../templates/index';
import { cautions, outdoorOf } from './specSheetCautions';
import { formatMoney } from '../../shared/format';

/** Options of {@link specSheetInput}. */
export interface SpecSheetOptions {
  settings: SalesSettings;
  /** The studio's materials by id (from the database), for material and colour names and the sun-heat check. */
  materials: ReadonlyMap<string, Material>;
  /** The studio's name, printed on every page. */
  studioName: string;
  /** The studio's locale (BCP 47) the price and dates are written in; the current format locale when left out. */
  locale?: string;
  /** Date printed on the sheet (default now). */
  issuedOn?: Date;
  /** A photo of the sample print (any format sharp reads); a rendered view is used when absent. */
  photo?: Buffer;
}

/**
 * Everything one variant's spec sheet shows: the body built upright from its template and parameters, a
 * three-view drawing, a picture, the bird fit, the sun heat of its colour (sol-air roof and wall temperatures beside
 * the material's heat-deflection temperature: stored with the variant, or assessed now), the shipping box and
 * weights, care and cautions.
 * @param variant - a published catalogue variant
 * @param options - settings, date and optional photo
 */
export async function specSheetInput(variant: CatalogueVariant, options: SpecSheetOptions): Promise<SpecSheetInput> {
  const product = await productMeshInWorker(variant.templateId, variant.params);
  const drawing = orthographicDrawing(product.mesh);
  const facts = variant.report.facts;
  const material = options.materials.get(variant.attributes.material);
  const colour = material?.colours.find((c) => c.id === variant.attributes.colour) ??
    material?.colours[0] ?? { id: 'natural', name: 'Natural', hex: '#e8e2d0', solarAbsorptance: 0.35 };
  const outdoor = outdoorOf(variant, material, colour.id);

  // Loaded on first use: the package takes a noticeable part of the server's start-up to load.
  const { default: sharp } = await import('sharp');
  const picture = options.photo
    ? {
        png: await sharp(options.photo).rotate().resize(800, 800, { fit: 'inside' }).png().toBuffer(),
        caption: 'Photo of the sample print',
      }
    : {
        png: await sharp(Buffer.from(shadedViewSvg(product.mesh, { colourHex: colour.hex, widthPx: 700 })))
          .png()
          .toBuffer(),
        caption: 'Rendered view from the design',
      };

  const o = drawing.overallMm;
  const box = shippingBox([o.widthMm, o.depthMm, o.heightMm], variant.report.massG, options.settings.packaging);
  const weights = options.settings.dimDivisors.map((divisor) =>
    dimensionalWeight(box.outerMm, box.actualMassG, divisor),
  );

  const fit = assessBirdFit(facts);
  const sources: string[] = [];
  const species = fit.suits.map((s) => {
    const full = fit.species.find((row) => row.speciesId === s.speciesId);
    let sourceIndex = sources.indexOf(s.source);
    if (sourceIndex === -1) sourceIndex = sources.push(s.source) - 1;
    return {
      commonName: s.commonName,
      scientificName: scientificName(s.speciesId) ?? '',
      region: s.region,
      mountingHeightM: full?.mountingHeightM ?? s.mountingHeightM,
      sourceIndex,
    };
  });

  return {
    studioName: options.studioName,
    locale: options.locale,
    sku: variant.sku,
    productName: productName(variant),
    familyName: variant.family.name,
    templateName: product.templateName,
    issuedOn: options.issuedOn ?? new Date(),
    picturePng: picture.png,
    pictureCaption: picture.caption,
    drawing,
    entryHoleDiameterMm: facts.entryHoleDiameterMm,
    holeAboveFloorMm: facts.holeAboveFloorMm,
    floorWidthMm: facts.floorWidthMm,
    floorDepthMm: facts.floorDepthMm,
    cavityDepthMm: facts.cavityDepthMm,
    wallThicknessMm: facts.wallThicknessMm,
    material: material?.name ?? variant.attributes.material.toUpperCase(),
    colour: { name: colour.name, hex: colour.hex },
    outdoor: outdoor
      ? {
          roofC: outdoor.roof.solAirC,
          wallC: outdoor.wall.solAirC,
          heatDeflectionC: outdoor.heatDeflectionC,
          airC: outdoor.airC,
        }
      : undefined,
    massG: variant.report.massG,
    backFit: backFit(variant.templateId, variant.params, o.widthMm),
    priceText: `${formatMoney(variant.priceCents, variant.currency, options.locale)} per unit, before tax and shipping`,
    species,
    sources: sources.map(pdfText),
    box,
    weights,
    care: CARE,
    cautions: [
      ...(product.templateVersion === variant.templateVersion
        ? []
        : [
            {
              title: 'Drawing',
              text: `The drawing is built with template version ${product.templateVersion}; this variant was published with version ${variant.templateVersion}, so shapes may differ slightly. The figures above are the published ones.`,
              source: '',
            },
          ]),
      ...cautions(variant, facts.hasPerch, material ?? null, outdoor, colour.solarAbsorptance, fit.suits),
    ],
  };
}

/**
 * One PDF of spec sheets (two pages per variant).
 * @param variants - the variants, in order
 * @param options - settings and date
 */
export async function renderSpecSheets(variants: CatalogueVariant[], options: SpecSheetOptions): Promise<Buffer> {
  const inputs: SpecSheetInput[] = [];
  for (const variant of variants) inputs.push(await specSheetInput(variant, options));
  return renderSpecSheetsPdf(inputs);
}

/**
 * A variant's product name: the family name with what sets the variant apart (its axis values).
 * @param variant - the variant
 */
export function productName(variant: CatalogueVariant): string {
  // Entry hole first, other shape axes next, colour, material and finish last.
  const rank = (key: string) =>
    key === 'entryHoleDiameterMm' ? 0 : ['colour', 'material', 'finish'].includes(key) ? 2 : 1;
  const parts = Object.entries(variant.axisValues)
    .sort(([a], [b]) => rank(a) - rank(b))
    .map(([key, value]) => axisLabel(key, value));
  return parts.length > 0 ? `${variant.family.name}, ${parts.join(', ')}` : variant.family.name;
}

function axisLabel(key: string, value: unknown): string {
  const words = (k: string) =>
    k
      .replace(/(Mm|Deg|Pct|Style)$/, '')
      .replace(/([A-Z])/g, ' $1')
      .toLowerCase();
  if (key === 'entryHoleDiameterMm' && typeof value === 'number') return `${value} mm entry`;
  if (typeof value === 'boolean') return `${value ? 'with' : 'no'} ${words(key)}`;
  if (key === 'colour' || key === 'material' || key === 'finish') return String(value).replace(/-/g, ' ');
  if (typeof value === 'string')
    return value === 'none' ? `no ${words(key)}` : `${value.replace(/-/g, ' ')} ${words(key)}`;
  const unit = key.endsWith('Mm') ? ' mm' : key.endsWith('Deg') ? '°' : key.endsWith('Pct') ? ' %' : '';
  return `${words(key)} ${String(value)}${unit}`;
}

function scientificName(speciesId: string): string | undefined {
  return SPECIES.find((s) => s.id === speciesId)?.scientificName;
}

/**
 * Which trunks, poles or posts the back fits, as the variant's template says.
 * @param templateId - the variant's template
 * @param params - the variant's complete parameters
 * @param widthMm - overall width of the body
 */
export function backFit(templateId: string, params: Record<string, unknown>, widthMm: number): string {
  const template = findTemplate(templateId);
  if (!template) throw new TemplateParamError('templateId', `There is no template called "${templateId}".`);
  // Defaults fill what an older variant lacks; the cross-parameter limits are the build's concern, not this text's.
  return template.mounting(template.parameters.parse(params), widthMm);
}

/** Care lines of every sheet. */
const CARE = [
  'Clear coat and paint, if used, go on the outside only: never inside the box or on the inside edge of the entry hole (NestWatch: paint the exterior only).',
  'Clean once a year after the nesting season: open the cleaning access, take out the old nest, brush the box out and let it dry before closing it.',
  'Check the fixings and look for cracks when you clean; replace a box that has gone brittle.',
];
