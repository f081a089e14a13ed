import { Worker } from 'node:worker_threads';
import type { VariantGeometry } from './variantGeometry';
import type { VariantWorkerRequest, VariantWorkerResponse } from './variantWorkerThread';

/** The worker entry next to this file (TypeScript, loaded through tsx inside the worker). */
const WORKER_URL = new URL('./variantWorkerThread.ts', import.meta.url);

/**
 * One worker thread that builds and analyses variants one at a time. The thread is started on first use and
 * terminated by {@link VariantWorker.close} (a cancelled job closes it so a long build stops at once).
 */
export class VariantWorker {
  private worker: Worker | undefined;
  private nextId = 1;
  private readonly waiting = new Map<number, { resolve: (g: VariantGeometry) => void; reject: (e: Error) => void }>();

  /**
   * Builds and analyses one parameter set in the worker.
   * @param templateId - template id
   * @param params - raw parameters
   */
  compute(templateId: string, params: Record<string, unknown>): Promise<VariantGeometry> {
    const worker = this.start();
    const requestId = this.nextId++;
    worker.ref();
    return new Promise((resolve, reject) => {
      this.waiting.set(requestId, { resolve, reject });
      worker.postMessage({ requestId, templateId, params } satisfies VariantWorkerRequest);
    });
  }

  /** Terminates the thread; pending computations reject. */
  async close(): Promise<void> {
    const worker = this.worker;
    this.worker = undefined;
    this.failAll(new Error('the computation was stopped'));
    if (worker) await worker.terminate();
  }

  private start(): Worker {
    if (this.worker) return this.worker;
    // The entry is TypeScript: a tiny bootstrap loads it through tsx's import API, which works under `tsx` and
    // inside vitest alike (loader flags in a worker's execArgv are not honoured on Node 20).
    const bootstrap = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(WORKER_URL.href)}, ${JSON.stringify(import.meta.url)}))`;
    const worker = new Worker(bootstrap, { eval: true });
    // An idle thread never keeps the process alive; one with work in hand does (see compute()).
    worker.unref();
    worker.on('message', (message: VariantWorkerResponse) => {
      const waiter = this.waiting.get(message.requestId);
      if (!waiter) return;
      this.waiting.delete(message.requestId);
      if (this.waiting.size === 0) worker.unref();
      if (message.ok) waiter.resolve(message.geometry);
      else waiter.reject(new Error(message.error));
    });
    worker.on('error', (err) => {
      this.failAll(err);
      if (this.worker === worker) this.worker = undefined;
    });
    worker.on('exit', () => {
      this.failAll(new Error('the computation worker stopped'));
      if (this.worker === worker) this.worker = undefined;
    });
    this.worker = worker;
    return worker;
  }

  private failAll(err: Error): void {
    for (const waiter of this.waiting.values()) waiter.reject(err);
    this.waiting.clear();
  }
}
