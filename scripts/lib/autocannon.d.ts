// The part of autocannon's programmatic API the benchmarks use (the package ships no types).
declare module 'autocannon' {
  interface Histogram {
    average: number;
    mean: number;
    stddev: number;
    min: number;
    max: number;
    p50: number;
    p90: number;
    p97_5: number;
    p99: number;
    total: number;
  }
  interface RawRequest {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    pipelining?: number;
    requests?: { method?: string; path?: string; setupRequest?: (req: RawRequest, context: Record<string, unknown>) => RawRequest }[];
  }
  export interface Result {
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
    statusCodeStats: Record<string, { count: number }>;
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
