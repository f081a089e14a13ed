import { onScopeDispose, ref, shallowRef } from 'vue';
import type { WallOptimum } from '../../shared/schemas/wallRecipe';
import type { WallRecipeRequest, WallRecipeResponse } from '../workers/wallRecipeProtocol';

/** Longest a search may run before the worker is stopped and the designer told. */
const SEARCH_TIME_LIMIT_MS = 60_000;

/**
 * Runs the wall-recipe optimizer in its own worker (started on first use): progress while the design is measured at
 * several wall thicknesses, then the optimum. A new search replaces one still running.
 * @returns the optimum, progress, error text, timings and `run(templateId, params, options)`
 */
export function useWallRecipe() {
  const optimum = shallowRef<WallOptimum | null>(null);
  const running = ref(false);
  const progress = ref<{ done: number; total: number; stage: string } | null>(null);
  const error = ref<string | null>(null);
  const timingsMs = ref<{ measure: number; search: number } | null>(null);
  let worker: Worker | null = null;
  let latest = 0;
  let timer: ReturnType<typeof setTimeout> | null = null;

  function stop(): void {
    worker?.terminate();
    worker = null;
    if (timer) clearTimeout(timer);
    timer = null;
  }

  function start(): Worker {
    const created = new Worker(new URL('../workers/wallRecipe.worker.ts', import.meta.url), { type: 'module' });
    created.onmessage = (event: MessageEvent<WallRecipeResponse>) => {
      const answer = event.data;
      if (answer.requestId !== latest) return;
      if (answer.kind === 'progress') {
        progress.value = { done: answer.done, total: answer.total, stage: answer.stage };
        return;
      }
      if (timer) clearTimeout(timer);
      running.value = false;
      progress.value = null;
      if (answer.kind === 'done') {
        optimum.value = answer.optimum;
        timingsMs.value = { measure: answer.measureMs, search: answer.searchMs };
        error.value = null;
      } else {
        error.value = answer.message;
      }
    };
    created.onerror = (event) => {
      event.preventDefault();
      stop();
      running.value = false;
      error.value = `The wall-recipe search stopped: ${event.message || 'unknown error'}`;
    };
    return created;
  }

  /**
   * Starts a search for the design.
   * @param templateId - the design's template
   * @param params - its parameters (millimetres)
   * @param options - range, target, printers, material, settings, rates and search bounds
   */
  function run(templateId: string, params: Record<string, unknown>, options: WallRecipeRequest['options']): void {
    latest += 1;
    worker ??= start();
    running.value = true;
    error.value = null;
    progress.value = { done: 0, total: 1, stage: 'Starting' };
    // Plain copies: reactive proxies cannot be cloned into the worker.
    const request: WallRecipeRequest = JSON.parse(JSON.stringify({ requestId: latest, templateId, params, options }));
    worker.postMessage(request);
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      stop();
      running.value = false;
      progress.value = null;
      error.value = `The search took longer than ${SEARCH_TIME_LIMIT_MS / 1000} s and was stopped.`;
    }, SEARCH_TIME_LIMIT_MS);
  }

  onScopeDispose(stop);
  return { optimum, running, progress, error, timingsMs, run };
}
