import type { AnyTemplate, ParameterDescription, TemplateParams } from '../types';
import { describeParameters } from './describeParameters';
import { findLimitViolation } from './findLimitViolation';

/** The range one numeric parameter may take now, given the values of all the others. */
export interface LiveLimit {
  min: number;
  max: number;
}

/** Live ranges by parameter key, one for every numeric parameter of a template. */
export type LiveLimits = Record<string, LiveLimit>;

/** Samples per parameter when its step grid is too fine to walk whole. */
const MAX_SAMPLES = 400;
const BISECTION_STEPS = 40;

/**
 * Each numeric parameter's live range: the values it may take, the other parameters staying as they are, that
 * {@link parseParams} accepts (the declared range narrowed by the template's cross-parameter limits). Pure and
 * geometry-free, so the editor can call it on every change.
 *
 * Each range is the run of allowed values around the current value (or the run nearest to it when the current
 * value is not allowed), found on the parameter's step grid and refined by bisection at its ends, then rounded
 * inwards to the step grid so every value a slider can reach inside it is allowed. When no value of a parameter
 * makes the set valid (another parameter is at fault), its declared range is given.
 * @param template - the template
 * @param input - current raw parameters (partial; missing, mistyped or out-of-range values are replaced by the
 *   default or clamped into the declared range before the ranges are worked out)
 */
export function liveLimits(template: AnyTemplate, input: unknown): LiveLimits {
  const described = describeParameters(template);
  const byKey = new Map(described.map((param) => [param.key, param]));
  const base = normalised(described, input);
  const limits: LiveLimits = {};
  for (const param of described) {
    if (param.kind !== 'number') continue;
    limits[param.key] = liveRange(template, base, byKey, param);
  }
  return limits;
}

/** Defaults merged in; numbers clamped into their declared range; values of the wrong type replaced by defaults. */
function normalised(described: ParameterDescription[], input: unknown): TemplateParams {
  const raw = (input && typeof input === 'object' ? input : {}) as Record<string, unknown>;
  const params: TemplateParams = {};
  for (const param of described) {
    const value = raw[param.key];
    if (param.kind === 'number') {
      const numeric = typeof value === 'number' && Number.isFinite(value) ? value : Number(param.default);
      params[param.key] = Math.min(param.max ?? Infinity, Math.max(param.min ?? -Infinity, numeric));
    } else if (param.kind === 'boolean') {
      params[param.key] = typeof value === 'boolean' ? value : (param.default as boolean);
    } else {
      params[param.key] =
        typeof value === 'string' && (param.options ?? []).includes(value) ? value : (param.default as string);
    }
  }
  return params;
}

function liveRange(
  template: AnyTemplate,
  base: TemplateParams,
  byKey: Map<string, ParameterDescription>,
  param: ParameterDescription,
): LiveLimit {
  const lo = param.min ?? 0;
  const hi = param.max ?? lo;
  const current = base[param.key] as number;
  const allowed = (value: number): boolean =>
    findLimitViolation(template, { ...base, [param.key]: value }, byKey) === null;

  const samples = sampleGrid(lo, hi, param.step, current);
  const ok = samples.map(allowed);
  if (!ok.some(Boolean)) return { min: lo, max: hi };
  // The run of allowed samples containing the current value, or the one nearest to it.
  let anchor = samples.indexOf(current);
  if (!ok[anchor]) {
    let best = -1;
    for (let i = 0; i < samples.length; i++) {
      if (ok[i] && (best < 0 || Math.abs(samples[i] - current) < Math.abs(samples[best] - current))) best = i;
    }
    anchor = best;
  }
  let first = anchor;
  while (first > 0 && ok[first - 1]) first--;
  let last = anchor;
  while (last < samples.length - 1 && ok[last + 1]) last++;

  let min = first === 0 ? lo : bisect(allowed, samples[first], samples[first - 1]);
  let max = last === samples.length - 1 ? hi : bisect(allowed, samples[last], samples[last + 1]);
  if (param.step) {
    min = Math.min(snap(lo, param.step, min, 'up'), samples[first]);
    max = Math.max(snap(lo, param.step, max, 'down'), samples[last]);
    // Snapping never leaves the allowed run: the grid values it reaches were sampled or lie inside the run.
    min = Math.max(lo, min);
    max = Math.min(hi, max);
  }
  return { min: tidy(min), max: tidy(max) };
}

/** The step grid from `lo` to `hi` (thinned to at most MAX_SAMPLES points) plus both ends and the current value. */
function sampleGrid(lo: number, hi: number, step: number | undefined, current: number): number[] {
  const span = hi - lo;
  const count = step && span / step <= MAX_SAMPLES ? Math.round(span / step) : MAX_SAMPLES;
  const points = new Set<number>([lo, hi, current]);
  for (let i = 0; i <= count; i++) points.add(tidy(lo + (span * i) / count));
  return [...points].filter((v) => v >= lo && v <= hi).sort((a, b) => a - b);
}

/** The boundary between an allowed value and a refused one, returned on the allowed side. */
function bisect(allowed: (value: number) => boolean, inside: number, outside: number): number {
  let a = inside;
  let b = outside;
  for (let i = 0; i < BISECTION_STEPS; i++) {
    const mid = (a + b) / 2;
    if (allowed(mid)) a = mid;
    else b = mid;
  }
  return a;
}

/** Rounds `value` onto the grid `lo + k·step`, upwards or downwards. */
function snap(lo: number, step: number, value: number, direction: 'up' | 'down'): number {
  const k = (value - lo) / step;
  const whole = direction === 'up' ? Math.ceil(k - 1e-9) : Math.floor(k + 1e-9);
  return tidy(lo + whole * step);
}

/** Drops floating-point tails (0.30000000000000004 → 0.3). */
function tidy(value: number): number {
  return Number(value.toFixed(9));
}
