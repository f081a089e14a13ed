/**
 * Cross-section of round filament, A = π·(d/2)².
 * @param filamentDiameterMm - nominal filament diameter (1.75 or 2.85)
 * @returns area in mm²
 */
export function filamentAreaMm2(filamentDiameterMm: number): number {
  return Math.PI * (filamentDiameterMm / 2) ** 2;
}

/**
 * Length of filament that holds a mass, L = m / (ρ·A).
 * @param massG - mass of plastic in grams
 * @param densityGcm3 - material density
 * @param filamentDiameterMm - nominal filament diameter
 * @returns length in metres
 */
export function filamentLengthM(massG: number, densityGcm3: number, filamentDiameterMm: number): number {
  const volumeMm3 = (massG / densityGcm3) * 1000;
  return volumeMm3 / filamentAreaMm2(filamentDiameterMm) / 1000;
}
