import type { AnalyzeMeshOptions } from '../../shared/analysis/analyzeMesh';
import type { MeshFormatReason } from '../../shared/mesh/MeshFormatError';
import type { AnalysisReport } from '../../shared/schemas/analysis';
import { TimedWorker } from '../workers/TimedWorker';
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

/**
 * One worker thread that analyses uploads one at a time, so a large mesh never blocks the server's event loop. A
 * request over the time limit terminates the thread and rejects with `timeout`; the next request starts a new one.
 */
export class AnalysisWorker {
  private readonly runner: TimedWorker<
    Omit<AnalysisWorkerRequest, 'requestId'>,
    AnalysisWorkerResponse,
    AnalysisReport
  >;

  /** @param timeLimitMs - the longest one analysis may take */
  constructor(timeLimitMs = ANALYSIS_TIME_LIMIT_MS) {
    this.runner = new TimedWorker({
      entryUrl: WORKER_URL,
      jobName: 'analysis',
      timeLimitMs,
      timeoutError: (limitMs) =>
        new AnalysisError('timeout', `the analysis took longer than ${limitMs / 1000} s and was stopped`),
      failedError: (message) => new AnalysisError('failed', message),
      settle: (message) => {
        if (message.ok) return message.report;
        if (message.kind === 'mesh') throw new AnalysisError('mesh', message.error, message.reason);
        throw new AnalysisError('failed', message.error);
      },
    });
  }

  /**
   * Parses the file and returns its report.
   * @param bytes - the uploaded file (copied to the worker)
   * @param filename - the uploaded name, for messages
   * @param options - orientation, printer, material, settings, rates
   */
  run(bytes: Uint8Array, filename: string | undefined, options: AnalyzeMeshOptions): Promise<AnalysisReport> {
    return this.runner.run({ bytes, filename, options });
  }

  /** Terminates the thread; pending analyses reject. */
  async close(): Promise<void> {
    await this.runner.close();
  }
}
