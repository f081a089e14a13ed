/**
 * The editor's geometry worker client: one build in flight, newer requests replace queued ones, stale answers are
 * dropped, errors name the parameter, a build over the time limit restarts the worker. Runs against a stand-in
 * Worker (no browser): what is checked is the request bookkeeping, the real worker runs in the browser test.
 * Expected behaviour is our own design (latest request wins), no outside source.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { effectScope } from 'vue';
import { useGeometryWorker } from '../src/composables/useGeometryWorker';
import type {
  FiguresRequest,
  GeometryRequest,
  GeometryResponse,
  ProductionChoice,
} from '../src/workers/geometryProtocol';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';

/** A printer, material and colour as the editor sends them. */
const CHOICE: ProductionChoice = {
  printer: DEFAULT_PRINTERS[0],
  material: DEFAULT_MATERIALS[0],
  colour: DEFAULT_MATERIALS[0].colours[0],
  settings: DEFAULT_SETTINGS,
  rates: DEFAULT_RATES,
};

class StandInWorker {
  static created: StandInWorker[] = [];
  posted: (GeometryRequest & FiguresRequest)[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent<GeometryResponse>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  constructor(
    readonly url: URL,
    readonly options: WorkerOptions,
  ) {
    StandInWorker.created.push(this);
  }
  postMessage(request: GeometryRequest & FiguresRequest): void {
    this.posted.push(request);
  }
  terminate(): void {
    this.terminated = true;
  }
  answer(response: GeometryResponse): void {
    this.onmessage?.({ data: response } as MessageEvent<GeometryResponse>);
  }
}

const FACTS = {
  entryHoleDiameterMm: 32,
  floorWidthMm: 120,
  floorDepthMm: 120,
  cavityDepthMm: 160,
  holeAboveFloorMm: 130,
  wallThicknessMm: 3,
  hasPerch: false,
  drainageHoleCount: 4,
  ventilationAreaMm2: 360,
  cleaningAccess: true,
  chambers: 1,
};

function meshAnswer(requestId: number, sha256: string | null, quality: 'draft' | 'full' = 'full'): GeometryResponse {
  return {
    requestId,
    ok: true,
    stage: 'mesh',
    templateVersion: 1,
    quality,
    mesh: { positions: new Float32Array(9), indices: new Uint32Array([0, 1, 2]) },
    facts: FACTS,
    sha256,
    partNames: ['body'],
    partTriangles: [1],
    overhangMask: new Uint8Array([1]),
    buildMs: 5,
  };
}

function figuresAnswer(requestId: number, volumeMm3: number): GeometryResponse {
  return {
    requestId,
    ok: true,
    stage: 'figures',
    figures: {
      volumeMm3,
      surfaceAreaMm2: 1,
      boundingBoxMm: [1, 1, 1],
      triangleCount: 1,
      bodyCount: 1,
      overhangAreaMm2: 0,
      supportVolumeMm3: 0,
      fitsPrinter: true,
      production: null,
      outdoor: null,
      birdFit: null,
      unavailable: [],
    },
    overhangMask: new Uint8Array(1),
    analysisMs: 3,
  };
}

beforeEach(() => {
  StandInWorker.created = [];
  vi.stubGlobal('Worker', StandInWorker);
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

describe('useGeometryWorker', () => {
  it('waits for one mesh at a time, sends only the latest queued request and drops stale answers', () => {
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('gable-box', { entryHoleDiameterMm: 28 }, CHOICE);
    geometry.request('gable-box', { entryHoleDiameterMm: 30 }, CHOICE);
    geometry.request('gable-box', { entryHoleDiameterMm: 32 }, CHOICE);
    const worker = StandInWorker.created[0];
    expect(StandInWorker.created).toHaveLength(1);
    expect(worker.options).toEqual({ type: 'module' });
    expect(worker.posted.map((r) => r.params.entryHoleDiameterMm)).toEqual([28]);
    expect(geometry.busy.value).toBe(true);

    // The first mesh is stale (two newer requests exist): dropped; the latest queued request goes next.
    const [first] = worker.posted;
    worker.answer(meshAnswer(first.requestId, 'a'.repeat(64)));
    expect(geometry.result.value).toBeNull();
    expect(worker.posted.map((r) => r.params.entryHoleDiameterMm)).toEqual([28, 32]);
    worker.answer({ requestId: first.requestId, ok: true, stage: 'skipped' });
    expect(geometry.busy.value).toBe(true);

    // The latest mesh shows at once; the design stays busy until its figures arrive.
    const latest = worker.posted[1];
    worker.answer(meshAnswer(latest.requestId, 'b'.repeat(64)));
    expect(geometry.result.value?.sha256).toBe('b'.repeat(64));
    expect(geometry.result.value?.figuresCurrent).toBe(false);
    expect(geometry.busy.value).toBe(true);
    // The overhang flags come with the mesh, so the viewer tints it in its first frame.
    const maskWithMesh = geometry.result.value?.overhangMask;
    expect(maskWithMesh).toEqual(new Uint8Array([1]));
    worker.answer(figuresAnswer(latest.requestId, 1234));
    expect(geometry.result.value?.figures?.volumeMm3).toBe(1234);
    expect(geometry.result.value?.figuresCurrent).toBe(true);
    // The figures carry the same flags; the array already shown is kept, so the viewer is not sent the mesh again.
    expect(geometry.result.value?.overhangMask).toBe(maskWithMesh);
    expect(geometry.busy.value).toBe(false);
    expect(geometry.error.value).toBeNull();

    scope.stop();
    expect(worker.terminated).toBe(true);
  });

  it('keeps the previous figures (marked not current) while a newer mesh waits for its analysis', () => {
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('gable-box', {}, CHOICE);
    const worker = StandInWorker.created[0];
    worker.answer(meshAnswer(worker.posted[0].requestId, 'c'.repeat(64)));
    worker.answer(figuresAnswer(worker.posted[0].requestId, 100));
    geometry.request('gable-box', { entryHoleDiameterMm: 40 }, CHOICE);
    worker.answer(meshAnswer(worker.posted[1].requestId, 'd'.repeat(64)));
    expect(geometry.result.value?.sha256).toBe('d'.repeat(64));
    expect(geometry.result.value?.figures?.volumeMm3).toBe(100);
    expect(geometry.result.value?.figuresCurrent).toBe(false);
    expect(geometry.result.value?.overhangMask).toEqual(new Uint8Array([1]));
    // Figures of an older request never overwrite the newer mesh's.
    worker.answer(figuresAnswer(worker.posted[0].requestId, 999));
    expect(geometry.result.value?.figures?.volumeMm3).toBe(100);
    scope.stop();
  });

  it('sends the next draft only after the frame that shows the last one, and a release at once', () => {
    vi.useFakeTimers();
    const frames: FrameRequestCallback[] = [];
    vi.stubGlobal('requestAnimationFrame', (callback: FrameRequestCallback) => frames.push(callback));
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('gable-box', { entryHoleDiameterMm: 30 }, CHOICE, undefined, 'entryHoleDiameterMm', 'draft');
    const worker = StandInWorker.created[0];
    worker.answer(meshAnswer(worker.posted[0].requestId, null, 'draft'));
    expect(geometry.result.value?.quality).toBe('draft');
    geometry.request('gable-box', { entryHoleDiameterMm: 31 }, CHOICE, undefined, 'entryHoleDiameterMm', 'draft');
    // The draft on screen is not drawn yet: the next draft waits.
    expect(worker.posted).toHaveLength(1);
    // The frame is drawn; the task queued from it runs after the frame: now the next draft goes.
    frames.shift()!(0);
    expect(worker.posted).toHaveLength(1);
    vi.advanceTimersByTime(0);
    expect(worker.posted.map((r) => r.params.entryHoleDiameterMm)).toEqual([30, 31]);

    // A release (full build) does not wait for the draft's frame.
    worker.answer(meshAnswer(worker.posted[1].requestId, null, 'draft'));
    geometry.request('gable-box', { entryHoleDiameterMm: 31 }, CHOICE, undefined, 'entryHoleDiameterMm', 'full');
    expect(worker.posted.map((r) => r.quality)).toEqual(['draft', 'draft', 'full']);

    // Without a frame (a hidden tab) a waiting draft still goes after 100 ms.
    worker.answer(meshAnswer(worker.posted[2].requestId, 'e'.repeat(64)));
    vi.advanceTimersByTime(100);
    frames.length = 0;
    geometry.request('gable-box', { entryHoleDiameterMm: 32 }, CHOICE, undefined, 'entryHoleDiameterMm', 'draft');
    worker.answer(meshAnswer(worker.posted[3].requestId, null, 'draft'));
    geometry.request('gable-box', { entryHoleDiameterMm: 33 }, CHOICE, undefined, 'entryHoleDiameterMm', 'draft');
    expect(worker.posted).toHaveLength(4);
    vi.advanceTimersByTime(100);
    expect(worker.posted.map((r) => r.params.entryHoleDiameterMm)).toEqual([30, 31, 31, 32, 33]);
    scope.stop();
  });

  it('shows a parameter error with its field, and clears it on the next good build', () => {
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('gable-box', { entryHoleDiameterMm: 99 }, CHOICE);
    const worker = StandInWorker.created[0];
    worker.answer({
      requestId: worker.posted[0].requestId,
      ok: false,
      field: 'entryHoleDiameterMm',
      message: 'Entry-hole diameter must be between 22 and 65 mm',
    });
    expect(geometry.error.value).toContain('between 22 and 65 mm');
    expect(geometry.errorField.value).toBe('entryHoleDiameterMm');
    expect(geometry.busy.value).toBe(false);

    geometry.request('gable-box', { entryHoleDiameterMm: 32 }, CHOICE);
    worker.answer(meshAnswer(worker.posted[1].requestId, 'e'.repeat(64)));
    expect(geometry.error.value).toBeNull();
    expect(geometry.errorField.value).toBeNull();
    scope.stop();
  });

  it('stops a build that runs past the time limit, says so, and starts a new worker for the next request', () => {
    vi.useFakeTimers();
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('bark-trunk', {}, CHOICE);
    const first = StandInWorker.created[0];
    vi.advanceTimersByTime(31_000);
    expect(first.terminated).toBe(true);
    expect(geometry.error.value).toMatch(/took longer than 30 s/);
    expect(geometry.busy.value).toBe(false);

    geometry.request('bark-trunk', { storeys: 1 }, CHOICE);
    expect(StandInWorker.created).toHaveLength(2);
    expect(StandInWorker.created[1].posted).toHaveLength(1);
    scope.stop();
  });

  it('shows a draft without figures, then sends the full mesh to the figures worker, which answers its figures', () => {
    const scope = effectScope();
    const geometry = scope.run(() => useGeometryWorker())!;
    geometry.request('gable-box', {}, CHOICE);
    const worker = StandInWorker.created[0];
    worker.answer(meshAnswer(worker.posted[0].requestId, 'f'.repeat(64)));
    const figuresWorker = StandInWorker.created[1];
    expect(String(figuresWorker.url)).toContain('figures.worker');
    expect(figuresWorker.posted).toHaveLength(1);
    figuresWorker.answer(figuresAnswer(worker.posted[0].requestId, 100));
    expect(geometry.result.value?.figuresCurrent).toBe(true);

    // A slider is held: the draft shows with no hash, nothing goes to the figures worker, the old figures stay.
    const draftId = geometry.request(
      'gable-box',
      { entryHoleDiameterMm: 33 },
      CHOICE,
      undefined,
      'entryHoleDiameterMm',
      'draft',
    );
    expect(worker.posted[1].quality).toBe('draft');
    worker.answer(meshAnswer(draftId, null, 'draft'));
    expect(geometry.result.value?.quality).toBe('draft');
    expect(geometry.result.value?.sha256).toBeNull();
    expect(geometry.result.value?.figures?.volumeMm3).toBe(100);
    expect(geometry.result.value?.figuresCurrent).toBe(false);
    expect(figuresWorker.posted).toHaveLength(1);
    expect(geometry.busy.value).toBe(false);

    // Release: the full build replaces the draft and its figures follow.
    const fullId = geometry.request('gable-box', { entryHoleDiameterMm: 33 }, CHOICE, undefined, 'entryHoleDiameterMm');
    worker.answer(meshAnswer(fullId, 'a'.repeat(64)));
    expect(geometry.result.value?.quality).toBe('full');
    expect(figuresWorker.posted).toHaveLength(2);
    expect(figuresWorker.posted[1].requestId).toBe(fullId);
    figuresWorker.answer(figuresAnswer(fullId, 120));
    expect(geometry.result.value?.figures?.volumeMm3).toBe(120);
    expect(geometry.busy.value).toBe(false);
    scope.stop();
    expect(figuresWorker.terminated).toBe(true);
  });
});
