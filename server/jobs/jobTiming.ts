/** Retry delays and time limits shared by both job-queue back ends. */
import type { RetryPolicy } from './JobQueue';

/** An attempt ran past its job's time limit. */
export class TimeLimitError extends Error {
  /** @param seconds - the time limit that passed */
  constructor(seconds: number) {
    super(`the job ran longer than its time limit of ${seconds} s`);
    this.name = 'TimeLimitError';
  }
}

/**
 * Seconds to wait before the retry that follows attempt number `attempt`: the policy's delay, doubled per attempt
 * when it backs off (common practice, no source: exponential backoff).
 * @param retry - the job's retry policy
 * @param attempt - the attempt that just failed (1 = the first)
 */
export function retryDelaySec(retry: RetryPolicy, attempt: number): number {
  return retry.backoff ? retry.delaySec * 2 ** (attempt - 1) : retry.delaySec;
}

/**
 * Runs `work` with a signal that aborts after `seconds` (or when `abort` is aborted from outside); rejects with
 * {@link TimeLimitError} at the limit even if the work ignores the signal.
 * @param seconds - the time limit
 * @param abort - the controller whose signal the work receives
 * @param work - the attempt
 */
export async function withTimeLimit<R>(
  seconds: number,
  abort: AbortController,
  work: (signal: AbortSignal) => Promise<R>,
): Promise<R> {
  let timer: NodeJS.Timeout | undefined;
  const limit = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      const err = new TimeLimitError(seconds);
      abort.abort(err);
      reject(err);
    }, seconds * 1000);
    abort.signal.addEventListener('abort', () => reject(abort.signal.reason), { once: true });
  });
  limit.catch(() => {});
  try {
    return await Promise.race([work(abort.signal), limit]);
  } finally {
    clearTimeout(timer);
  }
}
