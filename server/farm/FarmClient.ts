/**
 * Our typed client of the print farm's API (shared/schemas/farm.ts). Every call has a timeout; failures that may
 * pass (network errors, timeouts, 5xx, 429) are retried with exponential backoff and full jitter, honouring
 * Retry-After; every create carries an idempotency key so a retry never creates twice.
 */
import {
  PrintFileSchema,
  WorkOrderSchema,
  type PrintFile,
  type WorkOrder,
  type WorkOrderInput,
} from '../../shared/schemas/farm';

/** Options of {@link FarmClient}. */
export interface FarmClientOptions {
  /** Base address (FARM_API_URL), without `/v1`. */
  baseUrl: string;
  /** FARM_API_KEY. */
  apiKey: string;
  /** Per-attempt timeout (10 s by default). */
  timeoutMs?: number;
  /** Attempts per call, the first included (4 by default). */
  maxAttempts?: number;
  /** First backoff step (250 ms by default); step n waits a random time up to base × 2^n. */
  backoffBaseMs?: number;
  /** Longest single wait, Retry-After included (30 s by default). */
  maxDelayMs?: number;
  /** For tests: the wait (setTimeout by default). */
  sleep?: (ms: number) => Promise<void>;
  /** For tests: the random source of the jitter. */
  random?: () => number;
}

/** A farm call that failed: `retryable` when trying again later may succeed (farm down, timeout, throttled). */
export class FarmError extends Error {
  /**
   * @param message - for people
   * @param status - HTTP status, 0 for a network failure or timeout
   * @param code - the farm's error code, or `unreachable` / `timeout`
   * @param retryable - whether a later attempt may succeed
   * @param retryAfterMs - the wait the farm asked for (Retry-After), if any
   */
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
    readonly retryable: boolean,
    readonly retryAfterMs?: number,
  ) {
    super(message);
    this.name = 'FarmError';
  }
}

/** The farm API client. */
export class FarmClient {
  private readonly timeoutMs: number;
  private readonly maxAttempts: number;
  private readonly backoffBaseMs: number;
  private readonly maxDelayMs: number;
  private readonly sleep: (ms: number) => Promise<void>;
  private readonly random: () => number;

  /** @param options - address, key, timeout and retry policy */
  constructor(private readonly options: FarmClientOptions) {
    this.timeoutMs = options.timeoutMs ?? 10_000;
    this.maxAttempts = options.maxAttempts ?? 4;
    this.backoffBaseMs = options.backoffBaseMs ?? 250;
    this.maxDelayMs = options.maxDelayMs ?? 30_000;
    this.sleep = options.sleep ?? ((ms) => new Promise((resolve) => setTimeout(resolve, ms)));
    this.random = options.random ?? Math.random;
  }

  /**
   * Whether the farm already holds the print file of a mesh hash.
   * @param meshSha256 - our mesh hash
   */
  async hasPrintFile(meshSha256: string): Promise<boolean> {
    const answer = await this.call('GET', `/v1/print-files/${meshSha256}`, { allow404: true });
    return answer !== undefined;
  }

  /**
   * Uploads a print file under its mesh hash (the farm keeps the first copy; a repeat is harmless).
   * @param meshSha256 - our mesh hash of the mesh in the file
   * @param body - the STL or 3MF bytes
   * @param format - which of the two
   */
  async putPrintFile(meshSha256: string, body: Uint8Array<ArrayBuffer>, format: 'stl' | '3mf'): Promise<PrintFile> {
    const answer = await this.call('PUT', `/v1/print-files/${meshSha256}`, {
      body,
      contentType: format === 'stl' ? 'model/stl' : 'model/3mf',
      idempotencyKey: `file:${meshSha256}`,
    });
    return PrintFileSchema.parse(answer);
  }

  /**
   * Creates a work order; the same key always gives the same work order.
   * @param input - lines and ship-to
   * @param idempotencyKey - stable per intended work order (e.g. per dispatch row)
   */
  async createWorkOrder(input: WorkOrderInput, idempotencyKey: string): Promise<WorkOrder> {
    const answer = await this.call('POST', '/v1/work-orders', {
      body: JSON.stringify(input),
      contentType: 'application/json',
      idempotencyKey,
    });
    return WorkOrderSchema.parse(answer);
  }

  /** @param id - the farm's work-order id */
  async getWorkOrder(id: string): Promise<WorkOrder> {
    return WorkOrderSchema.parse(await this.call('GET', `/v1/work-orders/${encodeURIComponent(id)}`));
  }

  /** @param id - the farm's work-order id */
  async withdrawWorkOrder(id: string): Promise<WorkOrder> {
    const answer = await this.call('POST', `/v1/work-orders/${encodeURIComponent(id)}/withdraw`, {
      idempotencyKey: `withdraw:${id}`,
    });
    return WorkOrderSchema.parse(answer);
  }

  private async call(
    method: string,
    path: string,
    request: {
      body?: Uint8Array<ArrayBuffer> | string;
      contentType?: string;
      idempotencyKey?: string;
      allow404?: boolean;
    } = {},
  ): Promise<unknown> {
    let lastError: FarmError | undefined;
    for (let attempt = 0; attempt < this.maxAttempts; attempt++) {
      if (attempt > 0) await this.sleep(this.delayMs(attempt, lastError));
      try {
        return await this.once(method, path, request);
      } catch (err) {
        if (!(err instanceof FarmError) || !err.retryable) throw err;
        lastError = err;
      }
    }
    throw lastError ?? new FarmError('the farm did not answer', 0, 'unreachable', true);
  }

  /** Full jitter: random in [0, base × 2^attempt), or the farm's Retry-After when it gave one. */
  private delayMs(attempt: number, lastError: FarmError | undefined): number {
    const given = lastError?.retryAfterMs;
    if (given !== undefined) return Math.min(this.maxDelayMs, given);
    return Math.min(this.maxDelayMs, Math.floor(this.random() * this.backoffBaseMs * 2 ** attempt));
  }

  private async once(
    method: string,
    path: string,
    request: {
      body?: Uint8Array<ArrayBuffer> | string;
      contentType?: string;
      idempotencyKey?: string;
      allow404?: boolean;
    },
  ): Promise<unknown> {
    const headers: Record<string, string> = {
      authorization: `Bearer ${this.options.apiKey}`,
      accept: 'application/json',
    };
    if (request.contentType) headers['content-type'] = request.contentType;
    if (request.idempotencyKey) headers['idempotency-key'] = request.idempotencyKey;
    let response: Response;
    try {
      response = await fetch(new URL(path, this.options.baseUrl), {
        method,
        headers,
        body: request.body,
        signal: AbortSignal.timeout(this.timeoutMs),
      });
    } catch (err) {
      const timedOut = err instanceof Error && (err.name === 'TimeoutError' || err.name === 'AbortError');
      throw new FarmError(
        timedOut ? `the farm did not answer within ${this.timeoutMs / 1000} s` : 'the farm could not be reached',
        0,
        timedOut ? 'timeout' : 'unreachable',
        true,
      );
    }
    const text = await response.text();
    if (response.ok) return text ? (JSON.parse(text) as unknown) : {};
    if (response.status === 404 && request.allow404) return undefined;
    const error = parseError(text);
    const retryable = response.status === 429 || response.status >= 500;
    throw new FarmError(
      `the farm answered ${response.status}: ${error.message}`,
      response.status,
      error.code,
      retryable,
      retryable ? parseRetryAfter(response.headers.get('retry-after')) : undefined,
    );
  }
}

function parseError(text: string): { code: string; message: string } {
  try {
    const body = JSON.parse(text) as { error?: { code?: unknown; message?: unknown } };
    return {
      code: typeof body.error?.code === 'string' ? body.error.code : 'error',
      message: typeof body.error?.message === 'string' ? body.error.message : 'no message',
    };
  } catch {
    return { code: 'error', message: text.slice(0, 200) || 'no message' };
  }
}

/**
 * Retry-After as milliseconds: delta-seconds or an HTTP date (RFC 9110 §10.2.3); undefined when absent or bad.
 * @param value - the header value
 * @param nowMs - our clock
 */
export function parseRetryAfter(value: string | null, nowMs = Date.now()): number | undefined {
  if (!value) return undefined;
  if (/^\d+$/.test(value.trim())) return Number(value.trim()) * 1000;
  const at = Date.parse(value);
  return Number.isNaN(at) ? undefined : Math.max(0, at - nowMs);
}
