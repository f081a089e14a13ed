import type { IndexedMesh } from '../shared/schemas/mesh';
import type { NestBoxFacts } from '../shared/schemas/nestbox';
import { meshHash } from '../shared/mesh/meshHash';
import { findTemplate } from './findTemplate';
import { BuildContext, type BuildQuality } from './lib/BuildContext';
import { loadKernel } from './lib/kernel';
import { meshVolumeMm3 } from './lib/meshVolumeMm3';
import { parseParams, type ParseParamsOptions } from './lib/parseParams';
import { scoped } from './lib/scope';
import type { SolidCache } from './lib/SolidCache';
import { TemplateParamError } from './lib/TemplateParamError';
import { toMeshParts } from './lib/toMesh';
import type { TemplateParams } from './types';

/** One built design before hashing: the validated mesh of all parts in build orientation, at one quality. */
export interface BuiltDesign {
  template: { id: string; version: number };
  /** The complete parameters the mesh was built from (defaults merged). */
  params: TemplateParams;
  /** Full for exports, hashes and final figures; draft while a slider is held (coarser curves and texture). */
  quality: BuildQuality;
  mesh: IndexedMesh;
  /** Number of separate printable bodies. */
  partCount: number;
  partNames: string[];
  /** Triangles of each part: the mesh holds the parts one after another in `partNames` order. */
  partTriangles: number[];
  facts: NestBoxFacts;
  triangles: number;
}

/** One generated design at full quality: the validated mesh, its volume and its content hash. */
export interface GenerateResult extends BuiltDesign {
  quality: 'full';
  volumeMm3: number;
  /** sha256 of the canonical mesh bytes (see shared/mesh/meshHash.ts); only ever of a full-quality mesh. */
  sha256: string;
}

/** Options of {@link generate} and {@link generateDraft}. */
export interface GenerateOptions extends ParseParamsOptions {
  /**
   * Sub-solids kept from earlier builds (the editor's worker holds one); a reused sub-solid gives the same mesh
   * bytes as a cold build. Without it every sub-solid is built.
   */
  cache?: SolidCache;
}

async function build(
  templateId: string,
  rawParams: unknown,
  quality: BuildQuality,
  options: GenerateOptions,
): Promise<BuiltDesign> {
  const template = findTemplate(templateId);
  if (!template) throw new TemplateParamError('templateId', `There is no template called "${templateId}".`);
  const params = parseParams(template, rawParams, options);
  await loadKernel();
  const context = new BuildContext(quality, `${template.id}@${template.version}`, options.cache);
  // The part meshes are plain typed arrays, so they outlive the scope that frees the kernel objects.
  const output = scoped(() => template.build(params, context));
  const { mesh, partTriangles } = toMeshParts(output.parts);
  return {
    template: { id: template.id, version: template.version },
    params,
    quality,
    mesh,
    partCount: output.parts.length,
    partNames: output.parts.map((part) => part.name),
    partTriangles,
    facts: output.facts,
    triangles: mesh.indices.length / 3,
  };
}

/**
 * Builds a template at full quality with checked parameters and returns its validated mesh and hash. The browser
 * worker and the server both call this, so the same template version and parameters give the same sha256 on both.
 * @param templateId - a registered template id
 * @param rawParams - raw parameters (missing keys take defaults)
 * @param options - the parameter just moved (so a refusal it causes names it) and an optional sub-solid cache
 * @throws TemplateParamError for an unknown template or a bad parameter; MeshValidationError if the mesh is invalid
 */
export async function generate(
  templateId: string,
  rawParams: unknown,
  options: GenerateOptions = {},
): Promise<GenerateResult> {
  const built = await build(templateId, rawParams, 'full', options);
  return { ...built, quality: 'full', volumeMm3: meshVolumeMm3(built.mesh), sha256: await meshHash(built.mesh) };
}

/**
 * Builds a template at draft quality for the preview while a slider is held: the same shape with fewer segments on
 * curves, a coarser bark texture and shingles as slabs, still closed and manifold. It has no hash and is never
 * exported; the full build replaces it when the slider is released.
 * @param templateId - a registered template id
 * @param rawParams - raw parameters (missing keys take defaults)
 * @param options - as for {@link generate}
 */
export async function generateDraft(
  templateId: string,
  rawParams: unknown,
  options: GenerateOptions = {},
): Promise<BuiltDesign> {
  return build(templateId, rawParams, 'draft', options);
}
