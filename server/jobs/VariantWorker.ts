import { TimedWorker } from '../workers/TimedWorker';
import type { VariantGeometry } from './variantGeometry';
import type { VariantWorkerRequest, VariantWorkerResponse } from './variantWorkerThread';

/** The worker entry next to this file (TypeScript, loaded through tsx inside the worker). */
const WORKER_URL = new URL('./variantWorkerThread.ts', import.meta.url);

/**
 * The longest one variant's build and analysis may take, in seconds (FAMILY_VARIANT_TIME_LIMIT_SEC overrides it).
 * The largest demo variant takes about 2 s on a 2-core machine under load; stopping a stuck build frees the thread
 * for the rest of the family. The queued variant job uses the same limit.
 */
export const VARIANT_TIME_LIMIT_SEC = Number(process.env.FAMILY_VARIANT_TIME_LIMIT_SEC ?? 300);

/**
 * One worker thread that builds and analyses variants one at a time, on the shared time-limited runner. The
 * thread is started on first use and terminated by {@link VariantWorker.close} (a cancelled job closes it so a long
 * build stops at once).
 */
export class VariantWorker {
  private readonly runner: TimedWorker<Omit<VariantWorkerRequest, 'requestId'>, VariantWorkerResponse, VariantGeometry>;

  /** @param timeLimitMs - the longest one variant may take */
  constructor(timeLimitMs = VARIANT_TIME_LIMIT_SEC * 1000) {
    this.runner = new TimedWorker({
      entryUrl: WORKER_URL,
      jobName: 'computation',
      timeLimitMs,
      timeoutError: (limitMs) =>
        new Error(`building and checking the variant took longer than ${limitMs / 1000} s and was stopped`),
      failedError: (message) => new Error(message),
      settle: (message) => {
        if (message.ok) return message.geometry;
        throw new Error(message.error);
      },
    });
  }

  /**
   * Builds and analyses one parameter set in the worker.
   * @param templateId - template id
   * @param params - raw parameters
   */
  compute(templateId: string, params: Record<string, unknown>): Promise<VariantGeometry> {
    return this.runner.run({ templateId, params });
  }

  /** Terminates the thread; pending computations reject. */
  async close(): Promise<void> {
    await this.runner.close();
  }
}
