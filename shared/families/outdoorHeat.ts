import type { OutdoorAssessment } from '../schemas/outdoor';

/** Where the outdoor-heat figures come from, shown beside the gate warning. */
export const OUTDOOR_HEAT_SOURCE =
  'Sol-air temperature T_sa = T_o + α·I/h_o − ε·ΔR/h_o (ASHRAE Fundamentals; AMS Glossary of Meteorology) for a clear ' +
  'summer noon (30 °C air, roof 1000 W/m², wall 600 W/m², h_o 17 W/m²K), against the heat-deflection temperature at ' +
  '0.45 MPa of the material data sheet. Estimates: follow local rules and expert practice on siting.';

/**
 * The surfaces of an outdoor assessment that reach or pass the material's heat-deflection temperature in full sun,
 * as short reasons such as "roof in full sun reaches 82 °C, above PLA's 55 °C".
 * @param outdoor - the variant's outdoor assessment
 * @param materialName - the material's display name (e.g. "PLA")
 * @returns one reason per surface over the limit (empty when none is)
 */
export function outdoorHeatReasons(outdoor: OutdoorAssessment, materialName: string): string[] {
  const reasons: string[] = [];
  for (const [name, surface] of [
    ['roof', outdoor.roof],
    ['wall', outdoor.wall],
  ] as const) {
    if (surface.verdict !== 'fail') continue;
    reasons.push(
      `${name} in full sun reaches ${Math.round(surface.solAirC)} °C, above ${materialName}'s ${outdoor.heatDeflectionC} °C`,
    );
  }
  return reasons;
}

/**
 * Whether a roof or wall of the assessment reaches the material's heat-deflection temperature in full sun.
 * @param outdoor - an outdoor assessment, or undefined when none was made
 */
export function exceedsHeatDeflection(outdoor: OutdoorAssessment | undefined): boolean {
  return !!outdoor && (outdoor.roof.verdict === 'fail' || outdoor.wall.verdict === 'fail');
}
