import type { Axis, AxisValue, VariantAttributes } from '../schemas/familySpec';
import { skuFor } from './sku';

/** One cell of the variant matrix, before anything is computed. */
export interface VariantCell {
  /** Position in the matrix (axis order, last axis fastest). */
  index: number;
  /** Value per axis key. */
  axisValues: Record<string, AxisValue>;
  /** Canonical JSON of the axis values sorted by key. */
  variantKey: string;
  sku: string;
  /** Base parameters with this cell's parameter-axis values applied (template defaults not merged yet). */
  params: Record<string, AxisValue>;
  attributes: VariantAttributes;
}

/**
 * Number of variants the axes make: the product of the value counts (1 for no axes).
 * @param axes - the family's axes
 */
export function variantCount(axes: readonly Pick<Axis, 'values'>[]): number {
  return axes.reduce((count, axis) => count * axis.values.length, 1);
}

/**
 * Canonical identity of a variant: its axis values as JSON with keys sorted.
 * @param axisValues - value per axis key
 */
export function variantKeyOf(axisValues: Readonly<Record<string, AxisValue>>): string {
  const sorted = Object.keys(axisValues)
    .sort()
    .map((key) => [key, axisValues[key]]);
  return JSON.stringify(Object.fromEntries(sorted));
}

/** Input of {@link buildVariantMatrix}. */
export interface MatrixInput {
  familyCode: string;
  axes: readonly Axis[];
  baseParams: Readonly<Record<string, AxisValue>>;
  /** Material of variants without a material axis. */
  materialId: string;
}

/**
 * The cartesian product of the axes: one cell per combination, with its SKU, parameters and attributes.
 * Call {@link variantCount} first to refuse oversized families before building them.
 * @param input - family code, axes, base parameters and default material
 */
export function buildVariantMatrix(input: MatrixInput): VariantCell[] {
  const { axes } = input;
  const total = variantCount(axes);
  const cells: VariantCell[] = [];
  for (let index = 0; index < total; index++) {
    const axisValues: Record<string, AxisValue> = {};
    const params: Record<string, AxisValue> = { ...input.baseParams };
    const attributes: VariantAttributes = { colour: null, material: input.materialId, finish: null };
    let rest = index;
    for (let a = axes.length - 1; a >= 0; a--) {
      const axis = axes[a];
      const value = axis.values[rest % axis.values.length];
      rest = Math.floor(rest / axis.values.length);
      axisValues[axis.key] = value;
      if (axis.kind === 'param') params[axis.key] = value;
      else attributes[axis.key] = String(value);
    }
    const ordered = Object.fromEntries(axes.map((axis) => [axis.key, axisValues[axis.key]]));
    cells.push({
      index,
      axisValues: ordered,
      variantKey: variantKeyOf(ordered),
      sku: skuFor(input.familyCode, axes, ordered),
      params,
      attributes,
    });
  }
  return cells;
}
