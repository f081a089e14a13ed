import type { SpecTemplate } from '../../../shared/families/familySpecProblems';
import type { TemplateSummary } from '../../api/templates';
import { valueProblems } from './axisProblems';

/**
 * A template summary as the shared family spec check sees it: each parameter checked against its description
 * (kind, range, listed options). The server checks the full template schema again on save.
 * @param summary - the template as the editor loaded it
 */
export function summarySpecTemplate(summary: TemplateSummary): SpecTemplate {
  return {
    id: summary.id,
    version: summary.version,
    parameterKeys: summary.parameters.map((param) => param.key),
    paramProblem(params) {
      for (const param of summary.parameters) {
        if (!(param.key in params)) continue;
        const problem = valueProblems(params[param.key], param)[0];
        if (problem) return { field: param.key, message: problem };
      }
      return null;
    },
  };
}
