import { onScopeDispose, ref, shallowRef } from 'vue';
import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { NestBoxFacts } from '../../shared/schemas/nestbox';
import type { Region } from '../../shared/schemas/birdfit';
import type { LiveLimits } from '../../templates/lib/liveLimits';
import type { BuildQuality } from '../../templates/lib/BuildContext';
import type {
  DesignFigures,
  FiguresRequest,
  GeometryRequest,
  GeometryResponse,
  ProductionChoice,
} from '../workers/geometryProtocol';

/** Longest the worker may stay silent on a request before it is restarted and the design shows an error. */
const BUILD_TIME_LIMIT_MS = 30_000;

/** The design as the editor shows it: the latest mesh and, once analysed, its figures. */
export interface GeometryResult {
  requestId: number;
  templateVersion: number;
  /** `draft` while a slider is held (coarser, no hash, figures held back); `full` otherwise. */
  quality: BuildQuality;
  mesh: IndexedMesh;
  facts: NestBoxFacts;
  /** sha256 of the mesh content, hex; null for a draft (a hash is only ever of the full mesh). */
  sha256: string | null;
  /** Part names in mesh order ("body", "floor-plug"). */
  partNames: string[];
  /** Triangles of each part: the mesh holds the parts one after another. */
  partTriangles: number[];
  /** Figures of this mesh; until they arrive, the previous design's figures (see `figuresCurrent`). */
  figures: DesignFigures | null;
  /** Whether `figures` belong to this mesh. */
  figuresCurrent: boolean;
  /** Per-triangle overhang flags of this mesh, or null until analysed. */
  overhangMask: Uint8Array | null;
  timingsMs: { build: number; analysis: number | null };
  /** When the mesh reached the page (ms, performance clock). */
  arrivedAt: number;
}

/**
 * Runs template builds in a Web Worker so the page never freezes. At most one request waits for its mesh at a time;
 * newer requests replace queued ones (latest request wins) and answers to older requests are dropped. A full mesh
 * shows at once and goes on to a second worker for its figures, so an analysis never delays the next build; a draft
 * (slider held) gets no figures: the previous figures stay, marked as not current, until the full build.
 * @returns the latest result, busy flag, error text and field, and `request(templateId, params, production, region)`
 */
export function useGeometryWorker() {
  /** The latest design (mesh arrays are transferred: keep them out of deep reactivity). */
  const result = shallowRef<GeometryResult | null>(null);
  /** True until the latest request's figures (or its error) have arrived. */
  const busy = ref(false);
  const error = ref<string | null>(null);
  const errorField = ref<string | null>(null);
  /** Each numeric parameter's live range given the others, for the latest request (null until the first answer). */
  const limits = shallowRef<LiveLimits | null>(null);

  let worker: Worker | null = null;
  let figuresWorker: Worker | null = null;
  /** What each request was for, kept until its figures are asked for (full builds only). */
  const pending = new Map<number, { production: ProductionChoice; region?: Region }>();
  let nextId = 1;
  let latestId = 0;
  /** The request sent whose mesh has not arrived yet. */
  let awaitingMesh: number | null = null;
  let queued: GeometryRequest | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;
  /**
   * A draft just arrived and its frame is not drawn yet: the next draft waits for that frame. With software WebGL
   * every drawn frame is shaded and read back on the CPU, and a worker building at the same moment takes the CPU that
   * frame needs (2 cores).
   */
  let draftFramePending = false;

  function start(): Worker {
    const created = new Worker(new URL('../workers/geometry.worker.ts', import.meta.url), { type: 'module' });
    created.onmessage = (event: MessageEvent<GeometryResponse>) => settle(event.data);
    created.onerror = (event) => {
      event.preventDefault();
      restart();
      fail(`The geometry worker stopped: ${event.message || 'unknown error'}`);
      pump();
    };
    return created;
  }

  function stopTimer(): void {
    if (timer) clearTimeout(timer);
    timer = null;
  }

  function startFigures(): Worker {
    const created = new Worker(new URL('../workers/figures.worker.ts', import.meta.url), { type: 'module' });
    created.onmessage = (event: MessageEvent<GeometryResponse>) => settle(event.data);
    created.onerror = (event) => {
      event.preventDefault();
      figuresWorker?.terminate();
      figuresWorker = null;
      fail(`The figures worker stopped: ${event.message || 'unknown error'}`);
    };
    return created;
  }

  function restart(): void {
    worker?.terminate();
    worker = null;
    figuresWorker?.terminate();
    figuresWorker = null;
    awaitingMesh = null;
    stopTimer();
  }

  /** Sends a full mesh to the figures worker (a copy: the page keeps its own for the viewer and the exports). */
  function askFigures(requestId: number, mesh: IndexedMesh, facts: NestBoxFacts, partTriangles: number[]): void {
    const context = pending.get(requestId);
    if (!context) return;
    const copy = { positions: mesh.positions.slice(), indices: mesh.indices.slice() };
    const message: FiguresRequest = { requestId, mesh: copy, facts, partTriangles, ...context };
    figuresWorker ??= startFigures();
    figuresWorker.postMessage(message, [copy.positions.buffer, copy.indices.buffer]);
  }

  function fail(message: string, field: string | null = null): void {
    error.value = message;
    errorField.value = field;
    busy.value = queued !== null;
  }

  /** (Re)arms the time limit while the worker owes an answer about the latest request. */
  function armTimer(): void {
    stopTimer();
    if (!busy.value) return;
    timer = setTimeout(() => {
      restart();
      fail(`Building the model took longer than ${BUILD_TIME_LIMIT_MS / 1000} s and was stopped. Try other values.`);
      pump();
    }, BUILD_TIME_LIMIT_MS);
  }

  /** Lets the next draft go once the frame after this one has been drawn (or after 100 ms, e.g. a hidden tab). */
  function holdDraftsForFrame(): void {
    draftFramePending = true;
    let released = false;
    const release = (): void => {
      if (released) return;
      released = true;
      draftFramePending = false;
      pump();
    };
    // A task queued from the animation frame callback runs after that frame's paint and commit.
    if (typeof requestAnimationFrame === 'function') requestAnimationFrame(() => setTimeout(release, 0));
    setTimeout(release, 100);
  }

  function pump(): void {
    if (awaitingMesh !== null || !queued) return;
    // A full build (a release) never waits for the draft's frame.
    if (draftFramePending && queued.quality === 'draft') return;
    const next = queued;
    queued = null;
    worker ??= start();
    awaitingMesh = next.requestId;
    busy.value = true;
    worker.postMessage(next);
    armTimer();
  }

  function settle(response: GeometryResponse): void {
    if (awaitingMesh === response.requestId && (!response.ok || response.stage === 'mesh')) awaitingMesh = null;
    const latest = response.requestId === latestId;
    if (response.ok && response.stage === 'limits') {
      if (latest) limits.value = response.limits;
      return;
    }
    if (!response.ok) {
      if (latest) fail(response.message, response.field ?? null);
    } else if (response.stage === 'mesh' && latest) {
      const previous = result.value;
      result.value = {
        requestId: response.requestId,
        templateVersion: response.templateVersion,
        quality: response.quality,
        mesh: response.mesh,
        facts: response.facts,
        sha256: response.sha256,
        partNames: response.partNames,
        partTriangles: response.partTriangles,
        figures: previous?.figures ?? null,
        figuresCurrent: false,
        overhangMask: response.overhangMask,
        timingsMs: { build: response.buildMs, analysis: null },
        arrivedAt: performance.now(),
      };
      error.value = null;
      errorField.value = null;
      if (response.quality === 'full')
        askFigures(response.requestId, response.mesh, response.facts, response.partTriangles);
      // A draft gets no figures: nothing more is owed for it.
      else {
        busy.value = queued !== null;
        holdDraftsForFrame();
      }
    } else if (response.stage === 'figures' && latest && result.value?.requestId === response.requestId) {
      result.value = {
        ...result.value,
        figures: response.figures,
        figuresCurrent: true,
        // The mesh came with the same flags: keeping that array spares the viewer a second frame of the same picture.
        overhangMask: result.value.overhangMask ?? response.overhangMask,
        timingsMs: { ...result.value.timingsMs, analysis: response.analysisMs },
      };
      busy.value = queued !== null;
    }
    if (response.ok && (response.stage === 'figures' || response.stage === 'skipped'))
      pending.delete(response.requestId);
    armTimer();
    pump();
  }

  /**
   * Asks for a new build; earlier requests that have not been answered are dropped.
   * @param templateId - the template to build
   * @param params - raw parameters in millimetres
   * @param production - printer, material, colour, settings and rates the figures are for
   * @param region - bird-fit region, both when omitted
   * @param moved - the parameter the person just changed, so a refusal it causes names it
   * @param quality - `draft` while a slider is held, `full` otherwise
   * @returns the request's id (the page matches its timing marks to it)
   */
  function request(
    templateId: string,
    params: Record<string, unknown>,
    production: ProductionChoice,
    region?: Region,
    moved?: string,
    quality: BuildQuality = 'full',
  ): number {
    latestId = nextId++;
    for (const id of pending.keys()) if (id < latestId - 8) pending.delete(id);
    // Plain copies: reactive proxies cannot be cloned into the worker.
    queued = {
      requestId: latestId,
      templateId,
      params: { ...params },
      production: JSON.parse(JSON.stringify(production)) as ProductionChoice,
      region,
      moved,
      quality,
    };
    if (quality === 'full') pending.set(latestId, { production: queued.production, region });
    busy.value = true;
    pump();
    return latestId;
  }

  onScopeDispose(() => {
    restart();
    queued = null;
    pending.clear();
  });

  return { result, busy, error, errorField, limits, request };
}
