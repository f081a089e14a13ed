import type { AnyTemplate, ParameterDescription, TemplateParams } from '../types';

/** A parameter outside the range the other parameters allow: the key, the allowed range and why. */
export interface LimitViolation {
  key: string;
  /** Lowest allowed value (declared minimum or the cross-parameter limit, whichever is higher). */
  lo: number;
  /** Highest allowed value; below `lo` when no value is allowed. */
  hi: number;
  /** Phrase following the range, e.g. `for a 160 mm cavity (the entry stays under the roof)`. */
  because: string;
}

const TOLERANCE = 1e-9;

/**
 * The first cross-parameter limit of a template that the parameters break, or null when all hold. Pure and cheap:
 * it only evaluates the template's `limits()`, never builds geometry.
 * @param template - the template
 * @param params - parsed parameters (inside their declared ranges)
 * @param byKey - the template's parameter descriptions by key
 */
export function findLimitViolation(
  template: AnyTemplate,
  params: TemplateParams,
  byKey: Map<string, ParameterDescription>,
): LimitViolation | null {
  const limits = template.limits?.(params as never) ?? {};
  for (const [key, limit] of Object.entries(limits)) {
    const param = byKey.get(key);
    const value = params[key];
    if (!limit || !param || typeof value !== 'number') continue;
    const lo = Math.max(param.min ?? -Infinity, limit.minMm ?? -Infinity);
    const hi = Math.min(param.max ?? Infinity, limit.maxMm ?? Infinity);
    if (lo > hi || value < lo - TOLERANCE || value > hi + TOLERANCE) return { key, lo, hi, because: limit.because };
  }
  return null;
}
