/** Labels of the family axes as the axes builder shows them. */
import type { AttributeKey } from '../../../../shared/schemas/familySpec';
import type { ParameterDescription } from '../../../../templates/types';

/** Human names of the attribute axes. */
export const ATTRIBUTE_LABELS: Record<AttributeKey, string> = {
  colour: 'Colour',
  material: 'Material',
  finish: 'Finish',
};

/**
 * The unit shown after a parameter's values (mm, °, %), or nothing.
 * @param param - the template parameter, if known
 */
export function unitOf(param: ParameterDescription | undefined): string {
  if (!param) return '';
  return param.unit === 'mm' ? 'mm' : param.unit === 'deg' ? '°' : param.unit === '%' ? '%' : '';
}
