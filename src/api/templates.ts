import type { ParameterDescription } from '../../templates/types';

/** One template as the picker and the editor see it. */
export interface TemplateSummary {
  id: string;
  version: number;
  name: string;
  summary: string;
  parameters: ParameterDescription[];
  /** Default value of every parameter (millimetres for lengths). */
  defaults: Record<string, number | boolean | string>;
}

let catalogue: Promise<TemplateSummary[]> | null = null;

/**
 * Every template with its parameter descriptions. Templates are isomorphic code, so the client reads the registry
 * itself (one lazily loaded chunk) instead of asking the server; the server checks the same schemas on save/export.
 * @returns the templates in picker order
 */
export function loadTemplateCatalogue(): Promise<TemplateSummary[]> {
  catalogue ??= import('../../templates/index')
    .then(({ TEMPLATES, describeParameters }) =>
      TEMPLATES.map((template) => {
        const parameters = describeParameters(template);
        return {
          id: template.id,
          version: template.version,
          name: template.name,
          summary: template.summary,
          parameters,
          defaults: Object.fromEntries(parameters.map((param) => [param.key, param.default])),
        };
      }),
    )
    .catch((err: unknown) => {
      catalogue = null; // let a later visit try again
      throw err;
    });
  return catalogue;
}

/**
 * One template by id, or undefined when no such template exists.
 * @param id - template id
 */
export async function findTemplateSummary(id: string): Promise<TemplateSummary | undefined> {
  return (await loadTemplateCatalogue()).find((template) => template.id === id);
}
