import {
  AssessOutdoorOptionsSchema,
  type AssessOutdoorOptions,
  type OutdoorAssessment,
  type OutdoorVerdict,
  type SurfaceHeat,
} from '../schemas/outdoor';
import { solAirTemperature } from './solAirTemperature';
import { wallResistance } from './wallResistance';

/** Nestlings die above this inside temperature (Audubon 2024, quoting K. Stumpf). */
export const NESTLING_LETHAL_C = 41.7;

const ORDER: OutdoorVerdict[] = ['ok', 'caution', 'fail'];

function surface(solAirC: number, irradianceWm2: number, hdtC: number, cautionMarginK: number): SurfaceHeat {
  const marginK = hdtC - solAirC;
  const verdict: OutdoorVerdict = marginK <= 0 ? 'fail' : marginK < cautionMarginK ? 'caution' : 'ok';
  return { irradianceWm2, solAirC, marginK, verdict };
}

/**
 * Outdoor fitness of a box in one material and colour: sol-air temperatures of the sunlit roof and wall against
 * the material's heat-deflection temperature, the wall's thermal resistance beside a pine board, and the cautions
 * a seller must show. The figures are estimates; the texts defer to local rules and expert practice.
 * @param options - the material (heat-deflection temperature, conductivity, colours), one of its colours, the
 *   weather case (defaults: 30 °C air, roof 1000 W/m², wall 600 W/m²) and optionally the printed wall
 * @returns roof and wall results, the overall verdict and caution texts
 * @throws Error when the colour is not one of the material's colours
 */
export function assessOutdoor(options: AssessOutdoorOptions): OutdoorAssessment {
  const o = AssessOutdoorOptionsSchema.parse(options);
  const m = o.material;
  const colour = m.colours.find((c) => c.id === o.colourId);
  if (!colour) throw new Error(`colourId must be one of ${m.colours.map((c) => c.id).join(', ')}`);
  const a = colour.solarAbsorptance;

  const roofC = solAirTemperature({
    airC: o.airC,
    irradianceWm2: o.roofIrradianceWm2,
    absorptance: a,
    hoC: o.hoWm2K,
    longwaveCorrectionK: o.roofLongwaveCorrectionK,
  });
  const wallC = solAirTemperature({
    airC: o.airC,
    irradianceWm2: o.wallIrradianceWm2,
    absorptance: a,
    hoC: o.hoWm2K,
    longwaveCorrectionK: 0,
  });
  const roof = surface(roofC, o.roofIrradianceWm2, m.heatDeflectionC, o.cautionMarginK);
  const wall = surface(wallC, o.wallIrradianceWm2, m.heatDeflectionC, o.cautionMarginK);
  const verdict = ORDER[Math.max(ORDER.indexOf(roof.verdict), ORDER.indexOf(wall.verdict))]!;

  const cautions: string[] = [];
  for (const [name, s] of [
    ['roof', roof],
    ['wall', wall],
  ] as const) {
    if (s.verdict === 'fail') {
      cautions.push(
        `In full sun the ${name} can reach about ${s.solAirC.toFixed(1)} °C, above the ${m.name} heat-deflection ` +
          `temperature of ${m.heatDeflectionC} °C: it may sag or warp. Choose a lighter colour, a material that ` +
          'stands more heat, or a shaded site.',
      );
    } else if (s.verdict === 'caution') {
      cautions.push(
        `In full sun the ${name} can reach about ${s.solAirC.toFixed(1)} °C, within ${o.cautionMarginK} K of the ` +
          `${m.name} heat-deflection temperature of ${m.heatDeflectionC} °C.`,
      );
    }
  }
  if (a > 0.7) {
    cautions.push(
      'Dark colours run much hotter in sun; tests of painted boxes and panels found light colours coolest.',
    );
  }
  if (m.heatDeflectionC < 60) {
    cautions.push(
      `${m.name} softens and creeps from about 50 °C and is not UV-stabilised: expect a shorter outdoor life.`,
    );
  }
  cautions.push(
    `Plastic boxes with thin walls can overheat or hold condensation. Nestlings die above about ${NESTLING_LETHAL_C} °C ` +
      'inside a box, and a box can be several degrees hotter than the air: offer light colours, ventilation near ' +
      'the top, a roof that overhangs the sides, and a site shaded in the afternoon.',
    'These figures are estimates for a clear summer noon, not a guarantee. Follow local rules and the advice of ' +
      'local bird-conservation groups on siting and materials.',
  );
  if (o.airC >= 35) {
    cautions.push(
      'Where days regularly pass 35 °C, guidance is to paint or choose light colours and to shade the box.',
    );
  }

  const assessment: OutdoorAssessment = {
    materialId: m.id,
    colourId: colour.id,
    absorptance: a,
    heatDeflectionC: m.heatDeflectionC,
    airC: o.airC,
    roof,
    wall,
    verdict,
    cautions,
  };
  if (o.wall) {
    assessment.wallResistance = wallResistance({ ...o.wall, polymerK: m.thermalConductivityWmK });
    if (assessment.wallResistance.ratioToPine < 0.5) {
      cautions.push(
        `The wall insulates about ${Math.round(assessment.wallResistance.ratioToPine * 100)} % as well as a 19 mm pine ` +
          'board: thicken it or add enclosed air cells.',
      );
    }
  }
  return assessment;
}
