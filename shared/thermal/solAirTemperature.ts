import { SolAirInputSchema, type SolAirInput } from '../schemas/outdoor';

/**
 * Sol-air temperature of a sunlit outside surface, T_sa = T_o + α·I/h_o − ε·ΔR/h_o
 * (ASHRAE Fundamentals; AMS Glossary of Meteorology). A steady-state estimate of the outer surface temperature:
 * still air, reflective surroundings or a darker real colour can make it hotter.
 * @param input - air temperature, irradiance on the surface, absorptance, film coefficient, long-wave term
 * @returns the sol-air temperature in °C
 */
export function solAirTemperature(input: SolAirInput): number {
  const { airC, irradianceWm2, absorptance, hoC, longwaveCorrectionK } = SolAirInputSchema.parse(input);
  return airC + (absorptance * irradianceWm2) / hoC - longwaveCorrectionK;
}
