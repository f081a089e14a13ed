/// <reference lib="webworker" />
/**
 * The viewer worker: draws the preview on the OffscreenCanvas the page handed over. With software WebGL every drawn
 * frame is read back before it can be shown, and on the page's main thread that wait blocked input and layout for
 * 50-100 ms per full-resolution frame; here it blocks only this worker. The first message carries the canvas, every
 * later one is a stage command.
 */
import { createViewerStage, type StageCommand, type StageEvent } from '../components/viewer/viewerStage';

const scope = self as unknown as DedicatedWorkerGlobalScope;
let handle: ((command: StageCommand) => void) | null = null;

scope.onmessage = (event: MessageEvent<{ canvas: OffscreenCanvas } | StageCommand>) => {
  const data = event.data;
  if ('canvas' in data) {
    handle = createViewerStage(data.canvas, (message: StageEvent) => scope.postMessage(message));
    return;
  }
  handle?.(data);
};
