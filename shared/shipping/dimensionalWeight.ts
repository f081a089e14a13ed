import type { BoxDimensionsMm, DimDivisor, DimWeight } from '../schemas/shipping';

import { G_PER_LB, MM_PER_INCH } from '../format/units';

export { G_PER_LB, MM_PER_INCH };

/**
 * Dimensional and billable weight of a parcel under one carrier divisor, following the published UPS rule
 * (UPS help centre, "Determine billable weight"): each dimension rounded to the nearest whole inch (or centimetre), DIM weight = L × W × H ÷ divisor
 * rounded up to the next whole pound (or kilogram), actual weight rounded up likewise, billable = the larger.
 * A divisor with `appliesAboveVolume` (USPS: only parcels over 1 ft³) gives a DIM weight of 0 below that volume.
 * @param outerMm - outside dimensions of the box
 * @param actualMassG - product plus packaging
 * @param divisor - the carrier's divisor
 * @returns the weights in the divisor's units (lb or kg)
 */
export function dimensionalWeight(outerMm: BoxDimensionsMm, actualMassG: number, divisor: DimDivisor): DimWeight {
  const imperial = divisor.unitSystem === 'imperial';
  const mmPerUnit = imperial ? MM_PER_INCH : 10;
  const gPerUnit = imperial ? G_PER_LB : 1000;
  // Round half up to the nearest whole unit; at least one unit, a box is never 0 in long.
  const rounded = outerMm.map((mm) => Math.max(1, Math.floor(mm / mmPerUnit + 0.5))) as [number, number, number];
  const volume = rounded[0] * rounded[1] * rounded[2];
  const dimWeightExact = volume / divisor.divisor;
  const applies = volume > divisor.appliesAboveVolume;
  const dimWeight = applies ? ceilWhole(dimWeightExact) : 0;
  const actualWeight = ceilWhole(actualMassG / gPerUnit);
  return {
    divisorId: divisor.id,
    label: divisor.label,
    unitSystem: divisor.unitSystem,
    divisor: divisor.divisor,
    effectiveFrom: divisor.effectiveFrom,
    roundedDimensions: rounded,
    volume,
    dimWeightExact,
    dimWeight,
    actualWeight,
    billableWeight: Math.max(dimWeight, actualWeight),
    weightUnit: imperial ? 'lb' : 'kg',
  };
}

/** Up to the next whole unit, tolerant of float noise (2.0000000001 stays 2); never below 1. */
function ceilWhole(value: number): number {
  return Math.max(1, Math.ceil(value - 1e-9));
}
