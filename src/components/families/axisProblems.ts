import { AttributeValueSchema, type Axis, type AxisValue } from '../../../shared/schemas/familySpec';
import type { ParameterDescription } from '../../../templates/types';

/**
 * What is wrong with one axis before it is sent: unknown parameter, no values, a value out of the template's range,
 * of the wrong kind, or listed twice. The server checks the same again (400 naming the field).
 * @param axis - the axis
 * @param parameters - the pinned template's parameter descriptions
 * @returns readable problems, empty when the axis is fine
 */
export function axisProblems(axis: Axis, parameters: readonly ParameterDescription[]): string[] {
  const problems: string[] = [];
  if (!axis.values.length) problems.push('Add at least one value.');
  const seen = new Set<string>();
  for (const value of axis.values) {
    const key = JSON.stringify(value);
    if (seen.has(key)) problems.push(`${key} is listed twice.`);
    seen.add(key);
  }
  if (axis.kind === 'attribute') {
    for (const value of axis.values) {
      if (!AttributeValueSchema.safeParse(value).success)
        problems.push(`“${value}” must be a lower-case id such as uv-clear-coat.`);
    }
    return problems;
  }
  const param = parameters.find((item) => item.key === axis.key);
  if (!param) {
    problems.push(`The template has no parameter “${axis.key}”.`);
    return problems;
  }
  for (const value of axis.values) problems.push(...valueProblems(value, param));
  return problems;
}

/**
 * Why a value does not suit a parameter (kind, range, listed option), empty when it does.
 * @param value - the value
 * @param param - the parameter description
 */
export function valueProblems(value: AxisValue, param: ParameterDescription): string[] {
  if (param.kind === 'number') {
    if (typeof value !== 'number' || !Number.isFinite(value)) return [`${String(value)} is not a number.`];
    const unit = param.unit === 'mm' ? ' mm' : param.unit === 'deg' ? '°' : '';
    if (param.min !== undefined && value < param.min)
      return [`${value}${unit} is below the lowest ${param.label.toLowerCase()} (${param.min}${unit}).`];
    if (param.max !== undefined && value > param.max)
      return [`${value}${unit} is above the highest ${param.label.toLowerCase()} (${param.max}${unit}).`];
    return [];
  }
  if (param.kind === 'boolean') return typeof value === 'boolean' ? [] : [`${String(value)} is not yes or no.`];
  return typeof value === 'string' && (param.options ?? []).includes(value)
    ? []
    : [`“${String(value)}” is not one of ${(param.options ?? []).join(', ')}.`];
}
