import { SKU_PREFIX, type Axis, type AxisValue } from '../schemas/familySpec';

/** Letters or digits a word value keeps in its SKU segment. */
export const SKU_WORD_CHARS = 4;

/**
 * The SKU segment of one axis value. It depends on the value alone, so a variant keeps its SKU when values are added
 * to or removed from an axis: numbers as digits with `P` for the decimal point and `M` for a minus (`27.5` ->
 * `27P5`), booleans `Y`/`N`, words as their first four letters or digits upper-cased (`shingles` -> `SHIN`).
 * @param value - the value on the axis
 */
export function axisValueCode(value: AxisValue): string {
  if (typeof value === 'boolean') return value ? 'Y' : 'N';
  if (typeof value === 'number') {
    const text = String(Math.round(value * 1000) / 1000);
    return text.replace('-', 'M').replace('.', 'P');
  }
  const word = value.toUpperCase().replace(/[^A-Z0-9]/g, '');
  return word.slice(0, SKU_WORD_CHARS) || 'X';
}

/**
 * The SKU of a variant: `FH-<family code>-<segment per axis in axis order>`.
 * @param familyCode - the family's short code, e.g. `HGB`
 * @param axes - the family's axes, in order
 * @param axisValues - the variant's value per axis key
 */
export function skuFor(
  familyCode: string,
  axes: readonly Axis[],
  axisValues: Readonly<Record<string, AxisValue>>,
): string {
  const segments = axes.map((axis) => axisValueCode(axisValues[axis.key]));
  return [SKU_PREFIX, familyCode, ...segments].join('-');
}

/** A value as a sentence names it: numbers and yes/no as they read, words in quotes. */
function valueWords(value: AxisValue): string {
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  return typeof value === 'number' ? String(value) : `“${value}”`;
}

/** Two values of one axis that would give the same SKU segment. */
export interface SkuClash {
  /** Path of the second value, e.g. `axes.2.values.3`. */
  path: string;
  message: string;
}

/**
 * Values on the same axis whose SKU segments coincide (which would make two variants share a SKU).
 * @param axes - the family's axes
 */
export function findSkuClashes(axes: readonly Axis[]): SkuClash[] {
  const clashes: SkuClash[] = [];
  axes.forEach((axis, axisIndex) => {
    const seen = new Map<string, AxisValue>();
    axis.values.forEach((value, valueIndex) => {
      const code = axisValueCode(value);
      const earlier = seen.get(code);
      if (earlier !== undefined) {
        clashes.push({
          path: `axes.${axisIndex}.values.${valueIndex}`,
          message: `${valueWords(value)} and ${valueWords(earlier)} would share the SKU code ${code}: change one of them.`,
        });
      } else seen.set(code, value);
    });
  });
  return clashes;
}
