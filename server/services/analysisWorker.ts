import { Worker } from 'node:worker_threads';
import type { AnalyzeMeshOptions } from '../../shared/analysis/analyzeMesh';
import type { MeshFormatReason } from '../../shared/mesh/MeshFormatError';
import type { AnalysisReport } from '../../shared/schemas/analysis';
import type { AnalysisWorkerRequest, AnalysisWorkerResponse } from './analysisWorkerThread';

/** The worker entry next to this file (TypeScript, loaded through tsx inside the worker). */
const WORKER_URL = new URL('./analysisWorkerThread.ts', import.meta.url);

/** Default time limit of one analysis. */
export const ANALYSIS_TIME_LIMIT_MS = 30_000;

/** Why an analysis failed: a file that is not a readable mesh, the time limit, or anything else. */
export class AnalysisError extends Error {
  /**
   * @param kind - what went wrong
   * @param message - a sentence for the caller
   * @param reason - for `mesh`, why the file was refused
   */
  constructor(
    readonly kind: 'mesh' | 'timeout' | 'failed',
    message: string,
    readonly reason?: MeshFormatReason,
  ) {
    super(message);
    this.name = 'AnalysisError';
  }
}

interface Waiter {
  worker: Worker;
  resolve: (report: AnalysisReport) => void;
  reject: (err: Error) => void;
  timer: ReturnType<typeof setTimeout>;
}

/**
 * One worker thread that analyses uploads one at a time, so a large mesh never blocks the server's event loop. A
 * request over the time limit terminates the thread and rejects with `timeout`; the next request starts a new one.
 */
export class AnalysisWorker {
  private worker: Worker | undefined;
  private nextId = 1;
  private readonly waiting = new Map<number, Waiter>();

  /** @param timeLimitMs - the longest one analysis may take */
  constructor(private readonly timeLimitMs = ANALYSIS_TIME_LIMIT_MS) {}

  /**
   * Parses the file and returns its report.
   * @param bytes - the uploaded file (copied to the worker)
   * @param filename - the uploaded name, for messages
   * @param options - orientation, printer, material, settings, rates
   */
  run(bytes: Uint8Array, filename: string | undefined, options: AnalyzeMeshOptions): Promise<AnalysisReport> {
    const worker = this.start();
    const requestId = this.nextId++;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.waiting.delete(requestId);
        reject(new AnalysisError('timeout', `the analysis took longer than ${this.timeLimitMs / 1000} s and was stopped`));
        void this.restart();
      }, this.timeLimitMs);
      this.waiting.set(requestId, { worker, resolve, reject, timer });
      worker.postMessage({ requestId, bytes, filename, options } satisfies AnalysisWorkerRequest);
    });
  }

  /** Terminates the thread; pending analyses reject. */
  async close(): Promise<void> {
    await this.restart(new AnalysisError('failed', 'the analysis worker was stopped'));
  }

  private async restart(reason = new AnalysisError('failed', 'the analysis worker was restarted')): Promise<void> {
    const worker = this.worker;
    this.worker = undefined;
    if (!worker) return;
    this.failAll(worker, reason);
    await worker.terminate();
  }

  private start(): Worker {
    if (this.worker) return this.worker;
    // The entry is TypeScript: a bootstrap loads it through tsx's import API (works under tsx and vitest alike).
    const bootstrap = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(WORKER_URL.href)}, ${JSON.stringify(import.meta.url)}))`;
    const worker = new Worker(bootstrap, { eval: true });
    worker.unref();
    worker.on('message', (message: AnalysisWorkerResponse) => {
      const waiter = this.waiting.get(message.requestId);
      if (!waiter) return;
      this.waiting.delete(message.requestId);
      clearTimeout(waiter.timer);
      if (message.ok) waiter.resolve(message.report);
      else if (message.kind === 'mesh') waiter.reject(new AnalysisError('mesh', message.error, message.reason));
      else waiter.reject(new AnalysisError('failed', message.error));
    });
    worker.on('error', (err) => {
      this.failAll(worker, new AnalysisError('failed', `the analysis worker failed: ${err.message}`));
      if (this.worker === worker) this.worker = undefined;
    });
    worker.on('exit', () => {
      this.failAll(worker, new AnalysisError('failed', 'the analysis worker stopped'));
      if (this.worker === worker) this.worker = undefined;
    });
    this.worker = worker;
    return worker;
  }

  private failAll(worker: Worker, err: Error): void {
    for (const [requestId, waiter] of this.waiting) {
      if (waiter.worker !== worker) continue;
      clearTimeout(waiter.timer);
      this.waiting.delete(requestId);
      waiter.reject(err);
    }
  }
}
