import type { ShopVariant } from '../../../shared/schemas/shop';

/** A choice on each axis, by axis key. */
export type AxisChoice = Record<string, string | number | boolean>;

/**
 * The published variant that has `value` on `key` and matches the current choice on as many other axes as possible
 * (the picker never lands on a combination that was not published).
 * @param variants - published variants
 * @param choice - the current choice
 * @param key - the axis changed
 * @param value - its new value
 */
export function closestVariant(
  variants: readonly ShopVariant[],
  choice: AxisChoice,
  key: string,
  value: string | number | boolean,
): ShopVariant | undefined {
  let best: ShopVariant | undefined;
  let bestScore = -1;
  for (const variant of variants) {
    if (variant.axisValues[key] !== value) continue;
    const score = Object.entries(choice).filter(([k, v]) => k !== key && variant.axisValues[k] === v).length;
    if (score > bestScore) {
      best = variant;
      bestScore = score;
    }
  }
  return best;
}

/**
 * Whether picking `value` on `key` keeps every other current choice (else the picker changes them too).
 * @param variants - published variants
 * @param choice - the current choice
 * @param key - the axis
 * @param value - the value
 */
export function keepsOtherChoices(
  variants: readonly ShopVariant[],
  choice: AxisChoice,
  key: string,
  value: string | number | boolean,
): boolean {
  return variants.some(
    (v) => v.axisValues[key] === value && Object.entries(choice).every(([k, c]) => k === key || v.axisValues[k] === c),
  );
}
