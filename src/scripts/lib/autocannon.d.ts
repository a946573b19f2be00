/** The small part of autocannon's programmatic API the load bench uses (the package ships no types). */
declare module 'autocannon' {
  type Histogram = { min: number; max: number; average: number; stddev: number; p2_5: number; p50: number; p75: number; p90: number; p97_5: number; p99: number; p99_9: number };
  export type Result = {
    requests: Histogram & { total: number; sent: number };
    latency: Histogram & { totalCount: number };
    throughput: Histogram & { total: number };
    duration: number;
    errors: number;
    timeouts: number;
    mismatches: number;
    non2xx: number;
    resets: number;
    statusCodeStats: Record<string, { count: number }>;
  };
  export type Options = { url: string; connections?: number; duration?: number; amount?: number; timeout?: number; pipelining?: number; method?: string; headers?: Record<string, string> };
  export type Instance = Promise<Result> & { on(event: 'response', cb: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): Instance; on(event: 'reqError', cb: (err: Error) => void): Instance; stop(): void };
  function autocannon(opts: Options): Instance;
  export default autocannon;
}
