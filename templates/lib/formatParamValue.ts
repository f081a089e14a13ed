import type { ParameterDescription } from '../types';

/** The unit written after a parameter's value in a message (` mm`, ` deg`), empty for counts and plain numbers. */
export function unitSuffix(param: Pick<ParameterDescription, 'unit'>): string {
  return param.unit && param.unit !== 'count' ? ` ${param.unit}` : '';
}

/**
 * A parameter value as a message shows it: at most two decimals, trailing zeros dropped, with its unit
 * (`19.5 mm`, `3`).
 * @param param - the parameter (its unit)
 * @param value - the value in the parameter's own unit
 */
export function formatParamValue(param: Pick<ParameterDescription, 'unit'>, value: number): string {
  return `${Number(value.toFixed(2))}${unitSuffix(param)}`;
}
