import { Worker } from 'node:worker_threads';
import type { ExportFormat, ExportSummary, ExportWorkerRequest, ExportWorkerResponse } from './exportWorkerThread';

/** The worker entry next to this file (TypeScript, loaded through tsx inside the worker). */
const WORKER_URL = new URL('./exportWorkerThread.ts', import.meta.url);

/** Default time limit of one export. */
export const EXPORT_TIME_LIMIT_MS = 20_000;

/** Why an export failed: bad parameters, an invalid mesh, the time limit, or anything else in the build. */
export class ExportError extends Error {
  /**
   * @param kind - what went wrong
   * @param message - a sentence for the caller
   * @param field - the parameter at fault, for `params`
   */
  constructor(
    readonly kind: 'params' | 'mesh' | 'timeout' | 'failed',
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'ExportError';
  }
}

/** A finished export: the file bytes and what they hold. */
export interface ExportResult {
  file: Uint8Array;
  summary: ExportSummary;
}

interface Waiter {
  /** The thread the request was sent to: only its failure fails the request. */
  worker: Worker;
  resolve: (result: ExportResult) => void;
  reject: (err: Error) => void;
  timer: ReturnType<typeof setTimeout>;
}

/**
 * One worker thread that generates and writes exports one request at a time, with a time limit per request. A
 * request over the limit terminates the thread (a runaway build cannot be interrupted otherwise) and rejects with
 * `timeout`; the next request starts a fresh thread, so the server keeps answering.
 */
export class ExportWorker {
  private worker: Worker | undefined;
  private nextId = 1;
  private readonly waiting = new Map<number, Waiter>();

  /** @param timeLimitMs - the longest one export may take */
  constructor(private readonly timeLimitMs = EXPORT_TIME_LIMIT_MS) {}

  /**
   * Generates the template's mesh and writes it in the format.
   * @param templateId - template id
   * @param params - raw parameters (checked again in the worker)
   * @param format - `stl` or `3mf`
   * @param timeLimitMs - the limit for this request (default: the worker's)
   */
  run(templateId: string, params: unknown, format: ExportFormat, timeLimitMs = this.timeLimitMs): Promise<ExportResult> {
    const worker = this.start();
    const requestId = this.nextId++;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.waiting.delete(requestId);
        reject(new ExportError('timeout', `generation took longer than ${timeLimitMs / 1000} s and was stopped`));
        // Other requests queued on this thread fail too; the next call starts a new thread.
        void this.restart();
      }, timeLimitMs);
      this.waiting.set(requestId, { worker, resolve, reject, timer });
      worker.postMessage({ requestId, templateId, params, format } satisfies ExportWorkerRequest);
    });
  }

  /** Terminates the thread; pending exports reject. */
  async close(): Promise<void> {
    await this.restart(new ExportError('failed', 'the export worker was stopped'));
  }

  private async restart(reason = new ExportError('failed', 'the export worker was restarted')): Promise<void> {
    const worker = this.worker;
    this.worker = undefined;
    if (!worker) return;
    this.failAll(worker, reason);
    await worker.terminate();
  }

  private start(): Worker {
    if (this.worker) return this.worker;
    // The entry is TypeScript: a tiny bootstrap loads it through tsx's import API, which works under `tsx` and
    // inside vitest alike (loader flags in a worker's execArgv are not honoured on Node 20).
    const bootstrap = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(WORKER_URL.href)}, ${JSON.stringify(import.meta.url)}))`;
    const worker = new Worker(bootstrap, { eval: true });
    worker.unref();
    worker.on('message', (message: ExportWorkerResponse) => {
      const waiter = this.waiting.get(message.requestId);
      if (!waiter) return;
      this.waiting.delete(message.requestId);
      clearTimeout(waiter.timer);
      if (message.ok) waiter.resolve({ file: message.file, summary: message.summary });
      else waiter.reject(new ExportError(message.kind, message.error, message.field));
    });
    worker.on('error', (err) => {
      this.failAll(worker, new ExportError('failed', `the export worker failed: ${err.message}`));
      if (this.worker === worker) this.worker = undefined;
    });
    worker.on('exit', () => {
      this.failAll(worker, new ExportError('failed', 'the export worker stopped'));
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
