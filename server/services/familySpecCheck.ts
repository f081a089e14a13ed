/** Checks a family's content on the server: the shared spec check, its first problem as a 400 naming the field. */
import { familySpecProblems, type SpecTemplate, type SpecToCheck } from '../../shared/families/familySpecProblems';
import type { Material, PrinterProfile } from '../../shared/schemas/production';
import { findTemplate, parseParams, TemplateParamError } from '../../templates/index';
import { badRequest } from '../http/HttpError';

export type { SpecToCheck };

/**
 * The pinned template as the shared check sees it, read from the template registry.
 * @param templateId - template id
 */
export function specTemplateOf(templateId: string): SpecTemplate | undefined {
  const template = findTemplate(templateId);
  if (!template) return undefined;
  return {
    id: template.id,
    version: template.version,
    parameterKeys: Object.keys(template.parameters.shape),
    paramProblem(params) {
      try {
        parseParams(template, params);
        return null;
      } catch (err) {
        if (err instanceof TemplateParamError) return { field: err.field, message: err.message };
        throw err;
      }
    },
  };
}

/**
 * Checks a spec and returns the template version to pin (shared/families/familySpecProblems.ts).
 * @param spec - the family content
 * @param printers - known printers by id
 * @param materials - known materials by id
 * @throws HttpError 400 whose message starts with the field path, e.g. `axes.0.values.2: ...`, in the same shape
 *   as validate()
 */
export function checkFamilySpec(
  spec: SpecToCheck,
  printers: ReadonlyMap<string, PrinterProfile>,
  materials: ReadonlyMap<string, Material>,
): { templateVersion: number } {
  const { problems, templateVersion } = familySpecProblems(spec, specTemplateOf(spec.templateId), printers, materials);
  const first = problems[0];
  if (first || templateVersion === null) {
    const { path, message } = first ?? { path: 'templateId', message: `unknown template "${spec.templateId}"` };
    throw badRequest(`${path}: ${message}`, [{ in: 'body', path, message }]);
  }
  return { templateVersion };
}
