import { createViewerStage, type StageCommand, type StageEvent } from './viewerStage';

/** The page's end of a viewer stage. */
export interface StageLink {
  /** Sends a command; a model's arrays are copied (the page keeps its mesh for exports and figures). */
  send(command: StageCommand): void;
  /** Stops the stage (and its worker) and frees the GPU memory it held. */
  dispose(): void;
}

/**
 * Starts the stage that draws on `canvas`: in the viewer worker when the browser can hand a canvas to a worker (the
 * wait for each drawn frame then never blocks the page), else on the page itself.
 * @param canvas - the canvas on the page
 * @param onEvent - receives the stage's events
 */
export function linkViewerStage(canvas: HTMLCanvasElement, onEvent: (event: StageEvent) => void): StageLink {
  if (typeof canvas.transferControlToOffscreen === 'function' && typeof Worker === 'function') {
    const worker = new Worker(new URL('../../workers/viewer.worker.ts', import.meta.url), { type: 'module' });
    worker.onmessage = (event: MessageEvent<StageEvent>) => onEvent(event.data);
    worker.onerror = (event) => {
      event.preventDefault();
      onEvent({ type: 'failed', message: event.message || 'the viewer worker stopped' });
    };
    const offscreen = canvas.transferControlToOffscreen();
    worker.postMessage({ canvas: offscreen }, [offscreen]);
    return {
      send(command) {
        if (command.type !== 'model' || !command.mesh) {
          worker.postMessage(command);
          return;
        }
        const mesh = { positions: command.mesh.positions.slice(), indices: command.mesh.indices.slice() };
        const overhangMask = command.overhangMask?.slice() ?? null;
        const transfer: Transferable[] = [mesh.positions.buffer, mesh.indices.buffer];
        if (overhangMask) transfer.push(overhangMask.buffer);
        worker.postMessage({ ...command, mesh, overhangMask }, transfer);
      },
      dispose() {
        // Ending the worker ends its WebGL context too.
        worker.terminate();
      },
    };
  }
  const handle = createViewerStage(canvas, (event) => onEvent(event));
  return {
    send(command) {
      handle?.(command);
    },
    dispose() {
      handle?.({ type: 'dispose' });
    },
  };
}
