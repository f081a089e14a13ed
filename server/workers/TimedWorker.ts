import { Worker } from 'node:worker_threads';

/** How a {@link TimedWorker} starts its thread, names its failures and reads its answers. */
export interface TimedWorkerOptions<TResponse, TResult> {
  /** The TypeScript worker entry (loaded through tsx inside the thread). */
  entryUrl: URL;
  /** The job's name in messages, e.g. `export` gives "the export worker stopped". */
  jobName: string;
  /** The default longest time one request may take. */
  timeLimitMs: number;
  /** The error a request over its limit rejects with. */
  timeoutError: (timeLimitMs: number) => Error;
  /** The error for a thread that failed, stopped or was restarted. */
  failedError: (message: string) => Error;
  /** Turns the thread's answer into the result, or throws the typed error it carries. */
  settle: (response: TResponse) => TResult;
}

interface Waiter<TResult> {
  /** The thread the request was sent to: only its failure fails the request. */
  worker: Worker;
  resolve: (result: TResult) => void;
  reject: (err: Error) => void;
  timer: ReturnType<typeof setTimeout>;
}

/**
 * One worker thread that runs jobs one request at a time (requests queue in the thread), with a time limit per
 * request. A request over the limit terminates the thread (a runaway job cannot be interrupted otherwise) and rejects
 * with the timeout error; other requests on that thread fail too, and the next request starts a fresh thread, so
 * the server keeps answering.
 */
export class TimedWorker<TRequest extends object, TResponse extends { requestId: number }, TResult> {
  private worker: Worker | undefined;
  private nextId = 1;
  private readonly waiting = new Map<number, Waiter<TResult>>();

  /** @param options - thread entry, time limit, errors and how to read answers */
  constructor(private readonly options: TimedWorkerOptions<TResponse, TResult>) {}

  /**
   * Posts one job to the thread (its `requestId` is added here) and waits for its answer.
   * @param request - the job message without `requestId`
   * @param timeLimitMs - the limit for this request (default: the worker's)
   */
  run(request: TRequest, timeLimitMs = this.options.timeLimitMs): Promise<TResult> {
    const worker = this.start();
    const requestId = this.nextId++;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.waiting.delete(requestId);
        reject(this.options.timeoutError(timeLimitMs));
        // Other requests queued on this thread fail too; the next call starts a new thread.
        void this.restart();
      }, timeLimitMs);
      this.waiting.set(requestId, { worker, resolve, reject, timer });
      worker.postMessage({ requestId, ...request });
    });
  }

  /** Terminates the thread; pending requests reject. */
  async close(): Promise<void> {
    await this.restart(this.options.failedError(`the ${this.options.jobName} worker was stopped`));
  }

  private async restart(
    reason = this.options.failedError(`the ${this.options.jobName} worker was restarted`),
  ): Promise<void> {
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
    const bootstrap = `import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(this.options.entryUrl.href)}, ${JSON.stringify(import.meta.url)}))`;
    const worker = new Worker(bootstrap, { eval: true });
    worker.unref();
    worker.on('message', (message: TResponse) => {
      const waiter = this.waiting.get(message.requestId);
      if (!waiter) return;
      this.waiting.delete(message.requestId);
      clearTimeout(waiter.timer);
      let result: TResult;
      try {
        result = this.options.settle(message);
      } catch (err) {
        waiter.reject(err instanceof Error ? err : new Error(String(err)));
        return;
      }
      waiter.resolve(result);
    });
    worker.on('error', (err) => {
      this.failAll(worker, this.options.failedError(`the ${this.options.jobName} worker failed: ${err.message}`));
      if (this.worker === worker) this.worker = undefined;
    });
    worker.on('exit', () => {
      this.failAll(worker, this.options.failedError(`the ${this.options.jobName} worker stopped`));
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
