import type { ParameterDescription } from '../../../templates/types';
import { formatParamValue } from '../../../templates/lib/formatParamValue';

/** One parameter of a variant as people read it. */
export interface ParamLine {
  key: string;
  /** The template's label, e.g. "Perch"; for an attribute axis its own label. */
  label: string;
  /** The value with its unit or in words, e.g. "32 mm", "no", "shingles". */
  value: string;
}

/** Words for a choice value written in code style: `shingleRoof` or `shingle_roof` -> "shingle roof". */
function words(value: string): string {
  return value
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase();
}

/**
 * A variant's parameters with the template's labels and units, in the template's order (any key the template does
 * not describe, such as an attribute axis, comes last under `extraLabels` or its key).
 * @param params - the variant's parameter values (millimetres for lengths)
 * @param parameters - the template's parameter descriptions
 * @param extraLabels - labels of keys the template does not describe (attribute axes)
 */
export function describeVariantParams(
  params: Record<string, unknown>,
  parameters: readonly ParameterDescription[],
  extraLabels: Record<string, string> = {},
): ParamLine[] {
  const lines: ParamLine[] = [];
  for (const param of parameters) {
    if (!(param.key in params)) continue;
    const value = params[param.key];
    const text =
      typeof value === 'boolean'
        ? value
          ? 'yes'
          : 'no'
        : typeof value === 'number'
          ? param.unit === 'deg'
            ? `${Number(value.toFixed(2))}°`
            : formatParamValue(param, value)
          : words(String(value));
    lines.push({ key: param.key, label: param.label, value: text });
  }
  const described = new Set(parameters.map((param) => param.key));
  for (const [key, value] of Object.entries(params))
    if (!described.has(key))
      lines.push({
        key,
        label: extraLabels[key] ?? words(key),
        value: typeof value === 'boolean' ? (value ? 'yes' : 'no') : String(value),
      });
  return lines;
}
