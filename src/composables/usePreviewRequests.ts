import { ref, watch, type Ref } from 'vue';
import type { Region } from '../../shared/schemas/birdfit';
import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { BuildQuality } from '../../templates/lib/BuildContext';
import type { TemplateSummary } from '../api/templates';
import { useDesignStore } from '../stores/design';
import type { ProductionChoice } from '../workers/geometryProtocol';
import type { useGeometryWorker } from './useGeometryWorker';

/** What the editor hands over: its geometry worker and the choices a build depends on. */
export interface PreviewRequestsOptions {
  geometry: ReturnType<typeof useGeometryWorker>;
  productionChoice: Ref<ProductionChoice | null>;
  template: Ref<TemplateSummary | null>;
  region: Ref<Region | 'all'>;
}

/**
 * Turns the editor's value changes into preview builds: drafts while a slider is held, the full build on its
 * release (and for every other change), and the timing of each: from the input (or the release) to the frame that
 * first shows its mesh, recorded as a performance measure `nw-preview-draft` / `nw-preview-full` that the preview
 * bench reads in Chromium. Two more measures split it: `…-arrival` ends when the mesh reached the page (the build and
 * its transfer) and `…-screen` when the drawn frame had gone to the screen (with software WebGL, after its pixels
 * were read back).
 * @param options - the geometry worker and the production choice, template and region of the design
 * @returns the parameter moved last, and the handlers for a change, a hold, a release and a mesh on screen
 */
export function usePreviewRequests(options: PreviewRequestsOptions) {
  const { geometry, productionChoice, template, region } = options;
  const design = useDesignStore();
  /** The parameter the person changed last: a refusal it causes names it, not the parameter it pushed out of range. */
  const movedKey = ref<string | null>(null);
  /** A slider is held: the preview builds drafts (coarser, no figures) until it is let go. */
  const held = ref(false);
  /** Quality of the last build asked for, so a release asks for the full build only when a draft is on screen. */
  let lastQuality: BuildQuality = 'full';
  /** When the person moved a value last (ms, performance clock): the start of the preview latency measure. */
  let inputAt: number | null = null;
  const inputAtByRequest = new Map<number, number>();
  /** The mesh drawn last while its frame has not reached the screen: when its input began, and its quality. */
  let awaitingScreen: { mesh: IndexedMesh; started: number; quality: BuildQuality } | null = null;

  /** Asks the worker for the current values at the given quality and remembers when the change began. */
  function requestBuild(quality: BuildQuality): void {
    const templateId = design.templateId;
    const choice = productionChoice.value;
    if (!templateId || !choice || template.value?.id !== templateId) return;
    const id = geometry.request(
      templateId,
      design.params,
      choice,
      region.value === 'all' ? undefined : region.value,
      movedKey.value ?? undefined,
      quality,
    );
    lastQuality = quality;
    inputAtByRequest.set(id, inputAt ?? performance.now());
    for (const old of inputAtByRequest.keys()) if (old < id - 50) inputAtByRequest.delete(old);
    inputAt = null;
  }

  watch(
    () => [design.templateId, design.params, productionChoice.value, region.value] as const,
    () => requestBuild(held.value ? 'draft' : 'full'),
    { deep: true },
  );

  /**
   * A value changed in the panel.
   * @param key - parameter key
   * @param value - new value (millimetres for lengths)
   */
  function changeParam(key: string, value: number | boolean | string): void {
    inputAt = performance.now();
    movedKey.value = key;
    design.setParam(key, value);
  }

  /** A slider is held (before its first value change). */
  function holdSlider(): void {
    held.value = true;
  }

  /** The held slider was let go: the full build replaces the draft on screen. */
  function releaseSlider(): void {
    held.value = false;
    if (lastQuality === 'draft') {
      inputAt = performance.now();
      requestBuild('full');
    }
  }

  /**
   * The viewer drew a new mesh: records the time from its input to that frame.
   * @param mesh - the mesh the frame showed
   * @param drawnAt - when that frame was drawn (performance clock); now when omitted
   */
  function meshShown(mesh: IndexedMesh, drawnAt = performance.now()): void {
    const shown = geometry.result.value;
    if (!shown || shown.mesh !== mesh) return;
    const started = inputAtByRequest.get(shown.requestId);
    if (started === undefined) return;
    inputAtByRequest.delete(shown.requestId);
    const detail = { requestId: shown.requestId, templateId: design.templateId, triangles: mesh.indices.length / 3 };
    performance.measure(`nw-preview-${shown.quality}`, { start: started, end: Math.max(started, drawnAt), detail });
    performance.measure(`nw-preview-${shown.quality}-arrival`, {
      start: started,
      end: Math.max(started, shown.arrivedAt),
      detail,
    });
    awaitingScreen = { mesh, started, quality: shown.quality };
  }

  /**
   * The frame that showed a mesh reached the screen: records the time from its input to then.
   * @param mesh - the mesh the frame showed
   * @param presentedAt - when the frame went to the screen (performance clock)
   */
  function meshPresented(mesh: IndexedMesh, presentedAt: number): void {
    const waiting = awaitingScreen;
    if (waiting?.mesh !== mesh) return;
    awaitingScreen = null;
    performance.measure(`nw-preview-${waiting.quality}-screen`, {
      start: waiting.started,
      end: Math.max(waiting.started, presentedAt),
    });
  }

  return { movedKey, held, changeParam, holdSlider, releaseSlider, meshShown, meshPresented };
}
