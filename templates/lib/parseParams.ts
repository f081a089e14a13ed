import type { AnyTemplate, ParameterDescription, TemplateParams } from '../types';
import { describeParameters } from './describeParameters';
import { TemplateParamError } from './TemplateParamError';

function allowedRange(param: ParameterDescription): string {
  if (param.kind === 'boolean') return 'true or false';
  if (param.kind === 'choice') return `one of ${(param.options ?? []).join(', ')}`;
  const unit = param.unit && param.unit !== 'count' ? ` ${param.unit}` : '';
  return `between ${param.min} and ${param.max}${unit}`;
}

/**
 * Merges a template's defaults into raw input and checks it: unknown keys and out-of-range or mistyped values throw
 * a {@link TemplateParamError} whose message names the field and its allowed range, e.g.
 * `entryHoleDiameterMm must be between 22 and 65 mm`.
 * @param template - the template the parameters are for
 * @param input - raw parameters (partial; missing keys take their defaults)
 */
export function parseParams(template: AnyTemplate, input: unknown): TemplateParams {
  const raw = input ?? {};
  if (typeof raw !== 'object' || Array.isArray(raw)) {
    throw new TemplateParamError('params', 'params must be an object of parameter values');
  }
  const described = describeParameters(template);
  const byKey = new Map(described.map((param) => [param.key, param]));
  for (const key of Object.keys(raw)) {
    if (!byKey.has(key)) {
      throw new TemplateParamError(
        key,
        `${key} is not a parameter of ${template.id} (known: ${described.map((p) => p.key).join(', ')})`,
      );
    }
  }
  const result = template.parameters.safeParse(raw);
  if (!result.success) {
    const issue = result.error.issues[0];
    const key = String(issue?.path[0] ?? 'params');
    const param = byKey.get(key);
    if (!param) throw new TemplateParamError(key, `${key}: ${issue?.message ?? 'invalid'}`);
    const whole = issue?.code === 'invalid_type' && issue.expected === 'int' ? ' (a whole number)' : '';
    throw new TemplateParamError(key, `${key} must be ${allowedRange(param)}${whole}`);
  }
  const params = result.data as TemplateParams;
  checkLimits(template, params, byKey);
  return params;
}

/** Rounds a limit for a message: down for a maximum, up for a minimum, so the quoted range is safe to use. */
function roundLimit(value: number, up: boolean): number {
  return up ? Math.ceil(value * 10 - 1e-9) / 10 : Math.floor(value * 10 + 1e-9) / 10;
}

/**
 * Applies a template's cross-parameter limits: a value outside them is rejected with the field and the range that
 * the other parameters allow (never clamped silently).
 */
function checkLimits(template: AnyTemplate, params: TemplateParams, byKey: Map<string, ParameterDescription>): void {
  const limits = template.limits?.(params as never) ?? {};
  for (const [key, limit] of Object.entries(limits)) {
    const param = byKey.get(key);
    const value = params[key];
    if (!limit || !param || typeof value !== 'number') continue;
    const lo = Math.max(param.min ?? -Infinity, limit.minMm ?? -Infinity);
    const hi = Math.min(param.max ?? Infinity, limit.maxMm ?? Infinity);
    const unit = param.unit && param.unit !== 'count' ? ` ${param.unit}` : '';
    if (lo > hi) {
      throw new TemplateParamError(key, `${key} has no allowed value ${limit.because}; change the other parameters`);
    }
    if (value < lo - 1e-9 || value > hi + 1e-9) {
      throw new TemplateParamError(
        key,
        `${key} must be between ${roundLimit(lo, true)} and ${roundLimit(hi, false)}${unit} ${limit.because}`,
      );
    }
  }
}
