/** Checks a preset's parameters against its template, the same way exports and the editor do. */
import { badRequest } from '../http/HttpError';
import { findTemplate } from '../../templates/index';
import { parseParams } from '../../templates/lib/parseParams';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';

/**
 * Validates parameters with the template's parseParams: defaults merged, unknown keys and out-of-range values
 * rejected with a 400 that names the field and its allowed range.
 * @param templateId - the preset's template
 * @param input - raw parameters from the request
 * @returns the complete, checked parameters and the template version they were checked against
 */
export function checkPresetParams(
  templateId: string,
  input: unknown,
): { params: Record<string, unknown>; templateVersion: number } {
  const template = findTemplate(templateId);
  if (!template)
    throw badRequest(`There is no template called "${templateId}".`, [
      { in: 'body', path: 'templateId', message: 'unknown template' },
    ]);
  try {
    return { params: parseParams(template, input), templateVersion: template.version };
  } catch (err) {
    if (err instanceof TemplateParamError) {
      throw badRequest(err.message, [{ in: 'body', path: `params.${err.field}`, message: err.message }]);
    }
    throw err;
  }
}
