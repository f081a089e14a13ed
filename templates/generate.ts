import type { IndexedMesh } from '../shared/schemas/mesh';
import type { NestBoxFacts } from '../shared/schemas/nestbox';
import { meshHash } from '../shared/mesh/meshHash';
import { findTemplate } from './findTemplate';
import { loadKernel } from './lib/kernel';
import { meshVolumeMm3 } from './lib/meshVolumeMm3';
import { parseParams, type ParseParamsOptions } from './lib/parseParams';
import { scoped } from './lib/scope';
import { TemplateParamError } from './lib/TemplateParamError';
import { toMeshParts } from './lib/toMesh';
import type { TemplateParams } from './types';

/** One generated design: the validated mesh of all parts in build orientation and its content hash. */
export interface GenerateResult {
  template: { id: string; version: number };
  /** The complete parameters the mesh was built from (defaults merged). */
  params: TemplateParams;
  mesh: IndexedMesh;
  /** Number of separate printable bodies. */
  partCount: number;
  partNames: string[];
  /** Triangles of each part: the mesh holds the parts one after another in `partNames` order. */
  partTriangles: number[];
  facts: NestBoxFacts;
  triangles: number;
  volumeMm3: number;
  /** sha256 of the canonical mesh bytes (see shared/mesh/meshHash.ts). */
  sha256: string;
}

/**
 * Builds a template with checked parameters and returns its validated mesh. The browser worker and the server both
 * call this, so the same template version and parameters give the same sha256 on both.
 * @param templateId - a registered template id
 * @param rawParams - raw parameters (missing keys take defaults)
 * @param options - the parameter just moved, so a refusal it causes names it
 * @throws TemplateParamError for an unknown template or a bad parameter; MeshValidationError if the mesh is invalid
 */
export async function generate(
  templateId: string,
  rawParams: unknown,
  options: ParseParamsOptions = {},
): Promise<GenerateResult> {
  const template = findTemplate(templateId);
  if (!template) throw new TemplateParamError('templateId', `There is no template called "${templateId}".`);
  const params = parseParams(template, rawParams, options);
  await loadKernel();
  const output = scoped(() => template.build(params));
  const { mesh, partTriangles } = toMeshParts(output.parts);
  return {
    template: { id: template.id, version: template.version },
    params,
    mesh,
    partCount: output.parts.length,
    partNames: output.parts.map((part) => part.name),
    partTriangles,
    facts: output.facts,
    triangles: mesh.indices.length / 3,
    volumeMm3: meshVolumeMm3(mesh),
    sha256: await meshHash(mesh),
  };
}
