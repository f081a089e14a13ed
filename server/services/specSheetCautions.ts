/**
 * The cautions of a variant's spec sheet (also shown on the shop's product page): heat in the sun, perches, mounting
 * height, predator guards, its bird-fit warnings and local rules, each with its source.
 */
import { assessBirdFit, thinWallWarning } from '../../shared/birdfit/assessBirdFit';
import { studioReason } from '../../shared/families/publishPolicy';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { OutdoorAssessment } from '../../shared/schemas/outdoor';
import type { Material } from '../../shared/schemas/production';
import { assessOutdoor } from '../../shared/thermal/assessOutdoor';
import { formatCelsiusFahrenheit } from '../../shared/format';
import { pdfText } from '../pdf/pdfFonts';
import type { SpecSheetCaution } from '../pdf/specSheetPdf';

/** The variant's stored outdoor assessment when it matches its colour, else one made now; null for an unknown material. */
export function outdoorOf(
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

/**
 * Every caution of a variant's sheet: heat (with the sun-heat figures of its colour), perches, mounting height,
 * predator guards, the bird-fit warnings not covered above (acknowledged ones as limits with the studio's reason) and
 * local rules.
 */
export function cautions(
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
