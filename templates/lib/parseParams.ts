import type { AnyTemplate, ParameterDescription, TemplateParams } from '../types';
import { describeParameters } from './describeParameters';
import { findLimitViolation, type LimitViolation } from './findLimitViolation';
import { formatParamValue, unitSuffix } from './formatParamValue';
import { liveLimits } from './liveLimits';
import { TemplateParamError } from './TemplateParamError';

function allowedRange(param: ParameterDescription): string {
  if (param.kind === 'boolean') return 'on or off';
  if (param.kind === 'choice') return `one of ${(param.options ?? []).join(', ')}`;
  return `between ${param.min} and ${param.max}${unitSuffix(param)}`;
}

/** Options of {@link parseParams}. */
export interface ParseParamsOptions {
  /**
   * The parameter the person just changed. When its new value pushes another parameter out of the range the others
   * allow, the message (and the error's field) name this parameter and the range it may take, not the other one.
   */
  moved?: string;
}

/**
 * Merges a template's defaults into raw input and checks it: unknown keys and out-of-range or mistyped values throw
 * a {@link TemplateParamError} whose field is the parameter key and whose message names the parameter by its label
 * and gives its allowed range, e.g. `Entry-hole diameter must be between 22 and 65 mm`.
 * @param template - the template the parameters are for
 * @param input - raw parameters (partial; missing keys take their defaults)
 * @param options - which parameter was just moved, if any
 */
export function parseParams(template: AnyTemplate, input: unknown, options: ParseParamsOptions = {}): TemplateParams {
  const raw = input ?? {};
  if (typeof raw !== 'object' || Array.isArray(raw)) {
    throw new TemplateParamError('params', 'The parameters must be a set of named values');
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
    throw new TemplateParamError(key, `${param.label} must be ${allowedRange(param)}${whole}`);
  }
  const params = result.data as TemplateParams;
  const violation = findLimitViolation(template, params, byKey);
  if (violation) throw limitError(template, params, byKey, violation, options.moved);
  return params;
}

/** Rounds a limit for a message: down for a maximum, up for a minimum, so the quoted range is safe to use. */
function roundLimit(value: number, up: boolean): number {
  return up ? Math.ceil(value * 10 - 1e-9) / 10 : Math.floor(value * 10 + 1e-9) / 10;
}

/**
 * The error for a value outside the range the other parameters allow (never clamped silently). When another
 * parameter was just moved, the message leads with that one and the range it may take.
 */
function limitError(
  template: AnyTemplate,
  params: TemplateParams,
  byKey: Map<string, ParameterDescription>,
  violation: LimitViolation,
  moved: string | undefined,
): TemplateParamError {
  const { key, lo, hi, because } = violation;
  const param = byKey.get(key) as ParameterDescription;
  const own =
    lo > hi
      ? `${param.label} has no allowed value ${because}`
      : `${param.label} must be between ${roundLimit(lo, true)} and ${roundLimit(hi, false)}${unitSuffix(param)} ${because}`;
  const movedParam = moved !== undefined && moved !== key ? byKey.get(moved) : undefined;
  if (!movedParam || movedParam.kind !== 'number') {
    return new TemplateParamError(key, lo > hi ? `${own}; change the other parameters` : own);
  }
  const range = liveLimits(template, params)[movedParam.key];
  const shownValue = `${formatParamValue(movedParam, Number(params[movedParam.key]))}`;
  const stay =
    range && range.min <= range.max
      ? ` Keep ${movedParam.label.toLowerCase()} between ${formatParamValue(movedParam, range.min)} and ` +
        `${formatParamValue(movedParam, range.max)} with the other values as they are, or change ${param.label.toLowerCase()} first.`
      : ` Change ${param.label.toLowerCase()} first.`;
  return new TemplateParamError(
    movedParam.key,
    `${movedParam.label} of ${shownValue} leaves ${param.label.toLowerCase()} (${formatParamValue(param, Number(params[key]))}) out of range: ${own.charAt(0).toLowerCase()}${own.slice(1)}.${stay}`,
  );
}
