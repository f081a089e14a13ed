import { measureDesign, type DesignMeasure } from '../../shared/assessment/assessDesign';
import type { NestBoxFacts } from '../../shared/schemas/nestbox';
import { generate } from '../../templates/generate';

/** Ray budget of the support estimate: the analysis default, because the support budget gates the family. */
export const FAMILY_SUPPORT_RAYS = 200_000;
/**
 * Wall-thickness samples per variant, as many as the editor's live figures use: the wall figure informs and does
 * not gate, and on the gable box 4,000 samples took about 200 ms more per geometry for the same 5th percentile.
 */
export const FAMILY_WALL_SAMPLES = 1_500;

/**
 * What the worker measures for one parameter set: everything that depends on geometry alone (a {@link DesignMeasure}
 * for the design assessment, plus the facts and the report figures kept per variant).
 */
export interface VariantGeometry extends DesignMeasure {
  templateVersion: number;
  /** Complete parameters (defaults merged). */
  params: Record<string, number | boolean | string>;
  sha256: string;
  facts: NestBoxFacts;
  partCount: number;
  /** Size of each printable body in build orientation, largest first. */
  partSizesMm: Array<[number, number, number]>;
  triangles: number;
  volumeMm3: number;
  surfaceAreaMm2: number;
  upFacingAreaMm2: number;
  downFacingAreaMm2: number;
  footprintMm2: number;
  bboxSizeMm: [number, number, number];
  watertight: boolean;
  openEdges: number;
  nonManifoldEdges: number;
  components: number;
  overhangAreaMm2: number;
  supportVolumeMm3: number;
  maxBridgeSpanMm: number;
  /** 5th percentile of sampled wall thickness (the minimum is dominated by knife edges at corners). */
  thinnestWallMm: number | null;
  timingsMs: { generate: number; analyse: number };
}

/**
 * Builds one parameter set with the template and analyses the mesh as printed (+z up, templates already lay their
 * parts out in build orientation).
 * @param templateId - template id
 * @param params - raw parameters (missing keys take defaults)
 * @throws TemplateParamError / MeshValidationError from generate()
 */
export async function computeVariantGeometry(
  templateId: string,
  params: Record<string, unknown>,
): Promise<VariantGeometry> {
  const started = performance.now();
  const result = await generate(templateId, params);
  const built = performance.now();
  const { measure, report } = measureDesign(result.mesh, {
    partTriangles: result.partTriangles,
    geometry: { up: '+z', supportMaxRays: FAMILY_SUPPORT_RAYS, wallSamples: FAMILY_WALL_SAMPLES },
  });
  const analysed = performance.now();
  return {
    templateVersion: result.template.version,
    params: result.params,
    sha256: result.sha256,
    facts: result.facts,
    partCount: result.partCount,
    ...measure,
    triangles: report.triangles,
    watertight: report.watertight,
    openEdges: report.edges.openEdges,
    nonManifoldEdges: report.edges.nonManifoldEdges,
    components: report.components,
    overhangAreaMm2: report.overhang.areaMm2,
    maxBridgeSpanMm: report.bridges.maxSpanMm,
    timingsMs: { generate: built - started, analyse: analysed - built },
  };
}
