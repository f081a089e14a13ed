/** The part of autocannon's API the benches use (the package ships no types). */
declare module 'autocannon' {
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
  }
  interface Options {
    url: string | string[];
    connections?: number;
    duration?: number;
    timeout?: number;
    headers?: Record<string, string>;
    requests?: Request[];
  }
  interface Histogram {
    average: number;
    p50: number;
    p99: number;
    max: number;
    total: number;
  }
  interface Result {
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
