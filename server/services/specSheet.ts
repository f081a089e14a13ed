/** Gathers what a spec sheet shows for a published variant and renders it. */
import { assessBirdFit, thinWallWarning } from '../../shared/birdfit/assessBirdFit';
import { studioReason } from '../../shared/families/publishPolicy';
import { SPECIES } from '../../shared/birdfit/species';
import { orthographicDrawing } from '../../shared/drawing/orthographicDrawing';
import { shadedViewSvg } from '../../shared/drawing/shadedViewSvg';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { OutdoorAssessment } from '../../shared/schemas/outdoor';
import type { Material } from '../../shared/schemas/production';
import { assessOutdoor } from '../../shared/thermal/assessOutdoor';
import type { SalesSettings } from '../../shared/schemas/sales';
import { dimensionalWeight } from '../../shared/shipping/dimensionalWeight';
import { shippingBox } from '../../shared/shipping/shippingBox';
import { pdfText } from '../pdf/pdfFonts';
import { renderSpecSheetsPdf, type SpecSheetCaution, type SpecSheetInput } from '../pdf/specSheetPdf';
import { productMeshInWorker } from '../workers/ProductMeshWorker';
import { findTemplate, TemplateParamError } from '../../templates/index';
import { formatCelsiusFahrenheit, formatMoney } from '../../shared/format';

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

/** The variant's stored outdoor assessment when it matches its colour, else one made now; null for an unknown material. */
function outdoorOf(
  variant: CatalogueVariant,
  material: Material | undefined,
  colourId: string,
): OutdoorAssessment | null {
  const stored = variant.report.outdoor;
  if (stored && stored.colourId === colourId && stored.materialId === variant.attributes.material) return stored;
  if (!material || !material.colours.some((c) => c.id === colourId)) return null;
  return assessOutdoor({ material, colourId });
}

/** The sun-heat sentence of the heat caution, naming the surfaces above or near the heat-deflection temperature. */
function sunHeatText(o: OutdoorAssessment, materialName: string, colourName: string): string {
  const figures =
    `In full sun on a ${o.airC} °C day this ${colourName.toLowerCase()} box reaches about ${formatCelsiusFahrenheit(o.roof.solAirC)} ` +
    `on the roof and ${formatCelsiusFahrenheit(o.wall.solAirC)} on the walls; ${materialName} deforms under load from ` +
    `${formatCelsiusFahrenheit(o.heatDeflectionC, 0)}. `;
  const over = (['roof', 'wall'] as const).filter((name) => o[name].verdict === 'fail');
  const near = (['roof', 'wall'] as const).filter((name) => o[name].verdict === 'caution');
  const nearText =
    near.length > 0
      ? `The ${near.join(' and ')} comes within ${Math.round(Math.min(...near.map((n) => o[n].marginK)))} K of it`
      : '';
  if (over.length > 0) {
    return (
      `${figures}The ${over.join(' and ')} can pass that temperature and may sag or warp` +
      `${nearText ? `; ${nearText.charAt(0).toLowerCase()}${nearText.slice(1)}` : ''}: hang it in shade or choose a lighter colour. `
    );
  }
  return nearText ? `${figures}${nearText}: prefer a shaded site. ` : figures;
}

function cautions(
  variant: CatalogueVariant,
  hasPerch: boolean,
  material: Material | null,
  outdoor: OutdoorAssessment | null,
  solarAbsorptance: number,
  suits: Array<{ commonName: string; mountingHeightM: { min: number; max: number } }>,
): SpecSheetCaution[] {
  const outdoorAck = variant.acknowledgements.find((a) => a.code === 'outdoor-heat');
  const list: SpecSheetCaution[] = [
    {
      title: 'Heat',
      text:
        'A plastic box in full sun gets much hotter than the air, and above 41.7 °C (107 °F) inside is lethal to nestlings. ' +
        (outdoor && material
          ? sunHeatText(
              outdoor,
              material.name,
              material.colours.find((c) => c.id === outdoor.colourId)?.name ?? outdoor.colourId,
            )
          : material
            ? `The material softens from about ${material.heatDeflectionC} °C. `
            : '') +
        (solarAbsorptance >= 0.6 ? 'This colour absorbs most sunlight and runs hot: choose a shaded site. ' : '') +
        'Hang the box where it gets afternoon shade, facing away from the strongest sun. These figures are estimates; follow local advice.' +
        (outdoorAck && outdoor && (outdoor.roof.verdict === 'fail' || outdoor.wall.verdict === 'fail')
          ? ` Acknowledged limit: this colour can pass the material's heat-deflection temperature in full sun. ${pdfText(studioReason(outdoorAck.text))}`
          : ''),
      source:
        'Audubon (2024), K. Stumpf; sol-air temperature, ASHRAE Fundamentals (30 °C air, roof 1000 W/m², wall 600 W/m²); heat deflection at 0.45 MPa, material data sheet (PLA: NatureWorks)',
    },
    {
      title: 'Perches',
      text: hasPerch
        ? 'This variant has a perch under the entry. Perches help starlings, house sparrows and predators; offer it only where local guidance allows.'
        : 'Do not add a perch under the entry: perches help starlings, house sparrows and predators.',
      source: 'USFWS "For the Birds" (2001); Cornell nest-box features',
    },
    {
      title: 'Mounting height',
      text:
        suits.length > 0
          ? `Published heights for the birds it suits: ${suits.map((s) => `${s.commonName} ${s.mountingHeightM.min}–${s.mountingHeightM.max} m`).join('; ')}. Keep it out of reach of cats.`
          : 'Mount the box out of reach of cats at the height local guidance gives for the species you want.',
      source: 'species table sources above',
    },
    {
      title: 'Predator guards',
      text: 'On a post, use a smooth metal or plastic pole with a baffle; trees and wooden posts give climbing predators a hold. A metal plate round the hole stops it being enlarged.',
      source: 'NestWatch FAQ on predators',
    },
  ];
  const covered = new Set(['perch', 'predator-guard', 'mounting-height', 'plastic-heat']);
  for (const stored of variant.birdFitWarnings) {
    // The thin-wall sentence is worded now from the variant's wall figure and material, as the editor shows it
    // (variants computed earlier kept an older wording).
    const warning =
      stored.code === 'thin-walls'
        ? thinWallWarning(variant.report.facts.wallThicknessMm, {
            materialName: material?.name ?? variant.attributes.material.toUpperCase(),
            polymerK: material?.thermalConductivityWmK,
            ratioToPine: outdoor?.wallResistance?.ratioToPine ?? null,
          })
        : stored;
    if (!warning || warning.severity === 'info' || covered.has(warning.code)) continue;
    covered.add(warning.code);
    // A finding the studio acknowledged is stated plainly as a limit, with the studio's reason
    // (shared/families/publishPolicy.ts decides which findings may be published this way at all).
    const ack = variant.acknowledgements.find((a) => a.code === warning.code);
    list.push({
      title: ack ? `Acknowledged limit: ${warningTitle(warning.code).toLowerCase()}` : warningTitle(warning.code),
      text: pdfText(ack ? `${warning.message} ${studioReason(ack.text)}` : warning.message),
      source: pdfText(warning.source),
    });
  }
  list.push({
    title: 'Local rules',
    text:
      'Follow local rules and bird-conservation advice on where and when to put up nest boxes and on unwanted species. ' +
      'Figures on this sheet are estimates from the design: confirm them with a test print.',
    source: '',
  });
  return list;
}

function warningTitle(code: string): string {
  const words = code.replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/**
 * The cautions of a variant's spec sheet without building its mesh (the shop's product page shows them).
 * @param variant - a published catalogue variant
 * @param materials - the studio's materials by id
 */
export function variantCautions(
  variant: CatalogueVariant,
  materials: ReadonlyMap<string, Material>,
): SpecSheetCaution[] {
  const material = materials.get(variant.attributes.material);
  const colour = material?.colours.find((c) => c.id === variant.attributes.colour) ?? material?.colours[0];
  const outdoor = colour ? outdoorOf(variant, material, colour.id) : null;
  const fit = assessBirdFit(variant.report.facts);
  return cautions(
    variant,
    variant.report.facts.hasPerch,
    material ?? null,
    outdoor,
    colour?.solarAbsorptance ?? 0.5,
    fit.suits,
  );
}
