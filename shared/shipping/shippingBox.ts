import type { BoxDimensionsMm, PackagingRules, ShippingBox } from '../schemas/shipping';

/**
 * The carton for one unit: the product's bounding box plus padding on every side, each inside dimension rounded up
 * to the box step, plus two board thicknesses outside. Packaging mass = outside surface × board grammage + fill.
 * Dimensions are sorted largest first (carriers call them length, width, height).
 * @param productSizeMm - the product's overall size (any order)
 * @param productMassG - mass of the product
 * @param rules - padding, box step, board and fill
 */
export function shippingBox(
  productSizeMm: readonly number[],
  productMassG: number,
  rules: PackagingRules,
): ShippingBox {
  const inner = productSizeMm
    .map((mm) => Math.ceil((mm + 2 * rules.paddingMm) / rules.boxStepMm - 1e-9) * rules.boxStepMm)
    .sort((a, b) => b - a) as BoxDimensionsMm;
  const outer = inner.map((mm) => mm + 2 * rules.boardThicknessMm) as BoxDimensionsMm;
  const [l, w, h] = outer;
  const surfaceM2 = (2 * (l * w + l * h + w * h)) / 1e6;
  const packagingMassG = surfaceM2 * rules.boardGsm + rules.fillMassG;
  return { innerMm: inner, outerMm: outer, packagingMassG, actualMassG: productMassG + packagingMassG };
}
