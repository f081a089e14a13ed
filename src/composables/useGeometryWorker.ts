import { onScopeDispose, ref, shallowRef } from 'vue';
import type { Region } from '../../shared/schemas/birdfit';
import type { GeometryRequest, GeometryResponse } from '../workers/geometryProtocol';

/** Longest a single build may take before the worker is restarted and the design shows an error. */
const BUILD_TIME_LIMIT_MS = 30_000;

/** A successful worker answer. */
export type GeometryResult = Extract<GeometryResponse, { ok: true }>;

/**
 * Runs template builds in a Web Worker so the page never freezes. Only one build is in flight; while it runs, newer
 * requests replace each other and only the latest is sent next (latest request wins, stale answers are dropped).
 * @returns the latest result, busy flag, error text and `request(templateId, params, printerId)`
 */
export function useGeometryWorker() {
  /** The latest answer (mesh arrays are transferred, so keep them out of deep reactivity). */
  const result = shallowRef<GeometryResult | null>(null);
  const busy = ref(false);
  const error = ref<string | null>(null);
  const errorField = ref<string | null>(null);

  let worker: Worker | null = null;
  let nextId = 1;
  let latestId = 0;
  let inFlight: GeometryRequest | null = null;
  let queued: GeometryRequest | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;

  function start(): Worker {
    const created = new Worker(new URL('../workers/geometry.worker.ts', import.meta.url), { type: 'module' });
    created.onmessage = (event: MessageEvent<GeometryResponse>) => settle(event.data);
    created.onerror = (event) => {
      event.preventDefault();
      fail(`The geometry worker stopped: ${event.message || 'unknown error'}`);
      restart();
    };
    return created;
  }

  function restart(): void {
    worker?.terminate();
    worker = null;
    inFlight = null;
    if (timer) clearTimeout(timer);
    timer = null;
  }

  function fail(message: string, field: string | null = null): void {
    error.value = message;
    errorField.value = field;
    busy.value = queued !== null;
  }

  function send(request: GeometryRequest): void {
    worker ??= start();
    inFlight = request;
    busy.value = true;
    worker.postMessage(request);
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      restart();
      fail(`Building the model took longer than ${BUILD_TIME_LIMIT_MS / 1000} s and was stopped. Try other values.`);
      pump();
    }, BUILD_TIME_LIMIT_MS);
  }

  function pump(): void {
    if (inFlight || !queued) return;
    const next = queued;
    queued = null;
    send(next);
  }

  function settle(response: GeometryResponse): void {
    if (timer) clearTimeout(timer);
    timer = null;
    inFlight = null;
    if (response.requestId === latestId) {
      if (response.ok) {
        result.value = response;
        error.value = null;
        errorField.value = null;
      } else {
        fail(response.message, response.field ?? null);
      }
    }
    busy.value = queued !== null;
    pump();
  }

  /**
   * Asks for a new build; earlier requests that have not been answered are dropped.
   * @param templateId - the template to build
   * @param params - raw parameters in millimetres
   * @param printerId - printer profile the figures are for
   * @param region - bird-fit region, both when omitted
   */
  function request(templateId: string, params: Record<string, unknown>, printerId: string, region?: Region): void {
    latestId = nextId++;
    queued = { requestId: latestId, templateId, params: { ...params }, printerId, region };
    busy.value = true;
    pump();
  }

  onScopeDispose(() => {
    restart();
    queued = null;
  });

  return { result, busy, error, errorField, request };
}
