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
  return result.data as TemplateParams;
}
