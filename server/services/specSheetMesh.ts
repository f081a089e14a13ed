/** The product as it stands in use (body only, upright, front facing −y), built from a template for the spec sheet. */
import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { NestBoxFacts } from '../../shared/schemas/nestbox';
import { findTemplate, parseParams, TemplateParamError, type AnyTemplate } from '../../templates/index';
import { loadKernel } from '../../templates/lib/kernel';
import { scoped } from '../../templates/lib/scope';
import { toMesh } from '../../templates/lib/toMesh';

/** The product body in use orientation with what it offers a bird. */
export interface ProductMesh {
  templateName: string;
  /** Version of the template the mesh was built with (the current one). */
  templateVersion: number;
  /** Body only (no loose parts such as floor plugs), upright, resting on z = 0, centred on x and y. */
  mesh: IndexedMesh;
  facts: NestBoxFacts;
}

/**
 * Builds the template and returns its first part (the body) standing as it is used (the template's `inUse` turn).
 * @param templateId - a registered template id
 * @param rawParams - template parameters (missing keys take defaults)
 * @throws TemplateParamError for an unknown template or a bad parameter
 */
export async function productMesh(templateId: string, rawParams: unknown): Promise<ProductMesh> {
  const template = findTemplate(templateId);
  if (!template) throw new TemplateParamError('templateId', `There is no template called "${templateId}".`);
  const params = parseParams(template, rawParams);
  await loadKernel();
  const { mesh, facts } = scoped(() => {
    const output = template.build(params);
    return { mesh: toMesh(output.parts.slice(0, 1)), facts: output.facts };
  });
  return {
    templateName: template.name,
    templateVersion: template.version,
    mesh: standUpright(mesh, template.inUse),
    facts,
  };
}

/** Applies the turn, then rests the mesh on z = 0 and centres it on x and y. */
function standUpright(mesh: IndexedMesh, turn: AnyTemplate['inUse']): IndexedMesh {
  const p = Float32Array.from(mesh.positions);
  if (turn === 'turn-over-y')
    for (let i = 0; i < p.length; i += 3) {
      p[i] = -p[i];
      p[i + 2] = -p[i + 2];
    }
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < p.length; i++) {
    min[i % 3] = Math.min(min[i % 3], p[i]);
    max[i % 3] = Math.max(max[i % 3], p[i]);
  }
  const shift = [(min[0] + max[0]) / 2, (min[1] + max[1]) / 2, min[2]];
  for (let i = 0; i < p.length; i++) p[i] -= shift[i % 3];
  return { positions: p, indices: mesh.indices };
}
