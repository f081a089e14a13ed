import { computed, shallowRef, watch, type Ref } from 'vue';
import { useDesignStore } from '../stores/design';
import type { GeometryResult, useGeometryWorker } from './useGeometryWorker';

/**
 * What the editor's panels make of the preview's draft and full builds: the values and facts that only follow the
 * full build (so the side panels are not re-rendered at every step of a drag), and why the model on screen is older
 * than the values (so the figures are marked out of date and exports are blocked meanwhile).
 * @param geometry - the editor's geometry worker
 * @param held - true while a slider is held
 */
export function usePreviewState(geometry: ReturnType<typeof useGeometryWorker>, held: Ref<boolean>) {
  const design = useDesignStore();
  const result = geometry.result;

  /**
   * The values as they were when no slider was held: the economics panel (which only reads them when asked to search
   * for a wall recipe) is not re-rendered at every step of a drag.
   */
  const settledParams = shallowRef(design.params);
  watch([() => design.params, held], ([params, isHeld]) => {
    if (!isHeld) settledParams.value = params;
  });

  /**
   * The facts of the model the figures belong to (the last full build): a draft's facts are held back with its
   * figures, so the figures panel shows one model's facts and figures and is not re-rendered at every step of a drag.
   */
  const figuresFacts = shallowRef<GeometryResult['facts'] | null>(null);
  watch(
    result,
    (shown) => {
      if (!shown || shown.quality === 'full') figuresFacts.value = shown?.facts ?? null;
    },
    { immediate: true },
  );

  /**
   * Why the model and figures on screen are older than the values (null when they are current): exports are
   * blocked and the figures marked out of date meanwhile.
   */
  const staleReason = computed(() => {
    if (geometry.error.value)
      return geometry.errorField.value
        ? 'a value is out of range; the model and figures shown are from the last valid values.'
        : 'the model could not be built; the model and figures shown are from the last valid values.';
    if (result.value?.quality === 'draft')
      return 'the model on screen is a draft while the slider is held; the figures follow the full-quality model on release.';
    if (geometry.busy.value) return 'the model is being rebuilt with the new values.';
    return null;
  });

  /** Why the downloads are disabled now (null when they may run). */
  const exportBlockedReason = computed(() => {
    if (geometry.error.value) return 'Fix the marked value to download: the last valid model is not what is on screen.';
    if (result.value?.quality === 'draft') return 'Draft preview: downloads are full quality, after release.';
    if (geometry.busy.value) return 'Rebuilding…';
    return null;
  });

  return { settledParams, figuresFacts, staleReason, exportBlockedReason };
}
