/**
 * Volumetric flow of one extruded line, Q = layer height × line width × speed.
 * @param layerHeightMm - layer height
 * @param lineWidthMm - extrusion line width
 * @param speedMmS - print speed
 * @returns flow in mm³/s
 */
export function volumetricFlowMm3s(layerHeightMm: number, lineWidthMm: number, speedMmS: number): number {
  return layerHeightMm * lineWidthMm * speedMmS;
}
