/**
 * Runs autocannon in this process against one or more base URLs (several API processes share the connections) and
 * returns the figures the benches print.
 */
import autocannon from 'autocannon';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';

/** One request of the cycle each connection repeats. */
export interface LoadRequest {
  path: string;
  headers?: Record<string, string>;
}

/** Options of {@link runLoad}. */
export interface LoadOptions {
  /** Base URLs, e.g. one per API process; connections are spread over them. */
  baseUrls: string[];
  /** The cycle of requests every connection repeats. */
  requests: LoadRequest[];
  connections: number;
  durationS: number;
  /** Headers on every request (accept-encoding, cookie). */
  headers?: Record<string, string>;
  /** A request that takes longer than this counts as a timeout error (s). */
  timeoutS?: number;
  /** Server process ids whose CPU time is measured over the run (Linux: /proc/<pid>/stat). */
  serverPids?: number[];
}

/** What one run measured. */
export interface LoadFigures {
  reqPerS: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
  /** Connection errors, timeouts and answers that were not 2xx/304. */
  errors: number;
  timeouts: number;
  non2xx: number;
  requests: number;
  /** Bytes per answer, on the wire. */
  bytesPerAnswer: number;
  /** 1-minute load average at the end of the run. */
  load1: number;
  /**
   * CPU time the server processes spent per answer (ms, user + system), or null when unknown. Unlike req/s it does
   * not depend much on how busy the machine is.
   */
  cpuMsPerAnswer: number | null;
}

/** User + system CPU time of a process so far (ms), from /proc; null when it cannot be read. */
function cpuTimeMs(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    // Fields 14 and 15 of stat (utime, stime), counted from the state field (3); clock ticks of 10 ms on Linux.
    return (Number(fields[11]) + Number(fields[12])) * 10;
  } catch {
    return null;
  }
}

function totalCpuMs(pids: number[]): number | null {
  let total = 0;
  for (const pid of pids) {
    const ms = cpuTimeMs(pid);
    if (ms === null) return null;
    total += ms;
  }
  return total;
}

/**
 * Runs one load and returns its figures.
 * @param options - see {@link LoadOptions}
 */
export async function runLoad(options: LoadOptions): Promise<LoadFigures> {
  const cpuBefore = totalCpuMs(options.serverPids ?? []);
  const result = await autocannon({
    url: options.baseUrls,
    connections: options.connections,
    duration: options.durationS,
    timeout: options.timeoutS ?? 10,
    headers: options.headers ?? {},
    requests: options.requests.map((request) => ({ method: 'GET', path: request.path, headers: request.headers })),
  });
  const cpuAfter = totalCpuMs(options.serverPids ?? []);
  const non2xx = result.non2xx;
  return {
    reqPerS: result.requests.average,
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    maxMs: result.latency.max,
    errors: result.errors + non2xx,
    timeouts: result.timeouts,
    non2xx,
    requests: result.requests.total,
    bytesPerAnswer: result.requests.total ? result.throughput.total / result.requests.total : 0,
    load1: loadavg()[0],
    cpuMsPerAnswer:
      options.serverPids?.length && cpuBefore !== null && cpuAfter !== null && result.requests.total
        ? (cpuAfter - cpuBefore) / result.requests.total
        : null,
  };
}
