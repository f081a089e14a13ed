/// <reference lib="webworker" />
/**
 * The geometry worker: builds a template (the same generate() the server export uses, or generateDraft() while a
 * slider is held) and posts the mesh with its overhang flags, then (full builds only) each parameter's live range. Requests are handled one at a time in arrival order. Sub-solids whose
 * parameters did not change are reused from a small cache (a reused sub-solid gives the same mesh bytes). The
 * figures are computed by the figures worker, so an analysis never delays the next build. Meshes travel as
 * transferable typed arrays (moved, not copied).
 */
import '../zodJitless';
import { generate, generateDraft } from '../../templates/generate';
import { findTemplate } from '../../templates/index';
import { liveLimits } from '../../templates/lib/liveLimits';
import { SolidCache } from '../../templates/lib/SolidCache';
import { TemplateParamError } from '../../templates/lib/TemplateParamError';
import { overhangMaskOf } from '../../shared/analysis/overhangMask';
import type { GeometryRequest, GeometryResponse } from './geometryProtocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
let queue: Promise<void> = Promise.resolve();
/** Bark, skins, cuts and plugs of recent builds: 12 per quality, so a drag's drafts never evict the full solids. */
const cache = new SolidCache(12);

function post(response: GeometryResponse, transfer: ArrayBufferLike[] = []): void {
  // A Set: two views on one buffer must be listed once or postMessage throws.
  scope.postMessage(response, [...new Set(transfer)] as Transferable[]);
}

function fail(requestId: number, err: unknown): void {
  if (err instanceof TemplateParamError) post({ requestId, ok: false, field: err.field, message: err.message });
  else
    post({
      requestId,
      ok: false,
      message: `The model could not be built: ${err instanceof Error ? err.message : String(err)}`,
    });
}

async function handle(request: GeometryRequest): Promise<void> {
  const { requestId } = request;
  const started = performance.now();
  const options = { moved: request.moved, cache };
  try {
    const result =
      request.quality === 'draft'
        ? { ...(await generateDraft(request.templateId, request.params, options)), sha256: null }
        : await generate(request.templateId, request.params, options);
    const { mesh } = result;
    // The overhang tint goes with the mesh, so the preview draws the mesh once, tinted, not again when its figures come.
    const overhangMask = overhangMaskOf(mesh);
    post(
      {
        requestId,
        ok: true,
        stage: 'mesh',
        templateVersion: result.template.version,
        quality: result.quality,
        mesh,
        facts: result.facts,
        sha256: result.sha256,
        partNames: result.partNames,
        partTriangles: result.partTriangles,
        overhangMask,
        buildMs: performance.now() - started,
      },
      [mesh.positions.buffer, mesh.indices.buffer, overhangMask.buffer],
    );
  } catch (err) {
    fail(requestId, err);
  }
  // Live ranges after the mesh, and only for full builds: while a slider is held its own range does not change
  // (it depends on the other values), and the others' follow on release.
  const template = findTemplate(request.templateId);
  if (template && request.quality !== 'draft') {
    post({ requestId, ok: true, stage: 'limits', limits: liveLimits(template, request.params) });
  }
}

scope.onmessage = (event: MessageEvent<GeometryRequest>) => {
  const request = event.data;
  queue = queue.then(() => handle(request));
};
