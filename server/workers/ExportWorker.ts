import { TimedWorker } from './TimedWorker';
import type { ExportSummary, ExportTarget, ExportWorkerRequest, ExportWorkerResponse } from './exportWorkerThread';

/** Omit that keeps a union a union (each member loses the key on its own). */
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;

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

/**
 * One worker thread that generates and writes exports one request at a time, with a time limit per request. A
 * request over the limit terminates the thread (a runaway build cannot be interrupted otherwise) and rejects with
 * `timeout`; the next request starts a fresh thread, so the server keeps answering.
 */
export class ExportWorker {
  private readonly runner: TimedWorker<
    DistributiveOmit<ExportWorkerRequest, 'requestId'>,
    ExportWorkerResponse,
    ExportResult
  >;

  /** @param timeLimitMs - the longest one export may take */
  constructor(timeLimitMs = EXPORT_TIME_LIMIT_MS) {
    this.runner = new TimedWorker({
      entryUrl: WORKER_URL,
      jobName: 'export',
      timeLimitMs,
      timeoutError: (limitMs) =>
        new ExportError('timeout', `generation took longer than ${limitMs / 1000} s and was stopped`),
      failedError: (message) => new ExportError('failed', message),
      settle: (message) => {
        if (message.ok) return { file: message.file, summary: message.summary };
        throw new ExportError(message.kind, message.error, message.field);
      },
    });
  }

  /**
   * Generates the template's mesh and writes it in the format.
   * @param templateId - template id
   * @param params - raw parameters (checked again in the worker)
   * @param target - `{ format: 'stl' }`, or `{ format: '3mf', plate }` with the printer plate (and material) the 3MF
   *   is laid out for: required, there is no built-in printer to fall back on
   * @param timeLimitMs - the limit for this request (default: the worker's)
   */
  run(templateId: string, params: unknown, target: ExportTarget, timeLimitMs?: number): Promise<ExportResult> {
    return this.runner.run({ templateId, params, ...target }, timeLimitMs);
  }

  /** Terminates the thread; pending exports reject. */
  async close(): Promise<void> {
    await this.runner.close();
  }
}
