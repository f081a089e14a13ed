/**
 * The page's link to the viewer stage: where the browser can hand a canvas to a worker, the canvas goes to the viewer
 * worker and each command follows it; a mesh is sent as a copy, so the page's own mesh (kept for the exports and the
 * figures) stays whole. Runs against a stand-in Worker and canvas (no browser, no WebGL): the drawing itself is
 * checked in the designer browser test. Expected behaviour is our own design, no outside source.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { linkViewerStage } from '../src/components/viewer/stageLink';
import type { StageCommand, StageEvent } from '../src/components/viewer/viewerStage';

class StandInWorker {
  static created: StandInWorker[] = [];
  posted: { message: unknown; transfer: Transferable[] }[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent<StageEvent>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  constructor(readonly url: URL) {
    StandInWorker.created.push(this);
  }
  postMessage(message: unknown, transfer: Transferable[] = []): void {
    this.posted.push({ message, transfer });
  }
  terminate(): void {
    this.terminated = true;
  }
}

/** A canvas that can be handed over, as in a browser with OffscreenCanvas. */
function handingCanvas(offscreen: object): HTMLCanvasElement {
  return { transferControlToOffscreen: () => offscreen } as unknown as HTMLCanvasElement;
}

afterEach(() => {
  vi.unstubAllGlobals();
  StandInWorker.created = [];
});

describe('linkViewerStage', () => {
  it('hands the canvas to the viewer worker first, then sends each command after it', () => {
    vi.stubGlobal('Worker', StandInWorker);
    const offscreen = { kind: 'offscreen canvas' };
    linkViewerStage(handingCanvas(offscreen), () => {}).send({
      type: 'size',
      widthPx: 400,
      heightPx: 300,
      pixelRatio: 1,
    });
    const [worker] = StandInWorker.created;
    expect(worker.url.pathname).toMatch(/viewer\.worker\.ts$/);
    expect(worker.posted[0]).toEqual({ message: { canvas: offscreen }, transfer: [offscreen] });
    expect(worker.posted[1].message).toEqual({ type: 'size', widthPx: 400, heightPx: 300, pixelRatio: 1 });
  });

  it('sends a mesh and its overhang flags as copies: the page keeps its own arrays whole', () => {
    vi.stubGlobal('Worker', StandInWorker);
    const link = linkViewerStage(handingCanvas({}), () => {});
    const mesh = { positions: new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]), indices: new Uint32Array([0, 1, 2]) };
    const overhangMask = new Uint8Array([1]);
    link.send({ type: 'model', token: 7, mesh, overhangMask, surfaceColour: null });
    const sent = StandInWorker.created[0].posted[1];
    const message = sent.message as Extract<StageCommand, { type: 'model' }>;
    expect(message.token).toBe(7);
    expect(message.mesh!.positions).not.toBe(mesh.positions);
    expect(Array.from(message.mesh!.positions)).toEqual(Array.from(mesh.positions));
    expect(Array.from(message.mesh!.indices)).toEqual([0, 1, 2]);
    expect(Array.from(message.overhangMask!)).toEqual([1]);
    // The copies are moved to the worker, never the page's own buffers.
    expect(sent.transfer).toHaveLength(3);
    expect(sent.transfer).not.toContain(mesh.positions.buffer);
    expect(sent.transfer).not.toContain(overhangMask.buffer);
    expect(mesh.positions.length).toBe(9);
  });

  it("passes the worker's events on and ends the worker on dispose", () => {
    vi.stubGlobal('Worker', StandInWorker);
    const events: StageEvent[] = [];
    const link = linkViewerStage(handingCanvas({}), (event) => events.push(event));
    const worker = StandInWorker.created[0];
    worker.onmessage?.({ data: { type: 'drawn', token: 3, drawnAt: 1000 } } as MessageEvent<StageEvent>);
    expect(events).toEqual([{ type: 'drawn', token: 3, drawnAt: 1000 }]);
    link.dispose();
    expect(worker.terminated).toBe(true);
  });
});
