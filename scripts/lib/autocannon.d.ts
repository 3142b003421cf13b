// The part of autocannon 8's API the API benchmark uses (the package ships no types).
declare module 'autocannon' {
  export interface RawRequest {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
  }
  export interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
    requests?: (RawRequest & { setupRequest?: (req: RawRequest) => RawRequest })[];
  }
  export interface Histogram {
    average: number;
    p50: number;
    p99: number;
  }
  export interface Result {
    requests: Histogram & { total: number };
    latency: Histogram;
    duration: number;
    errors: number;
    timeouts: number;
    non2xx: number;
    statusCodeStats: Record<string, { count: number }>;
  }
  export interface Instance extends PromiseLike<Result> {
    on(event: 'response', fn: (client: unknown, statusCode: number, resBytes: number, responseTimeMs: number) => void): void;
  }
  function autocannon(opts: Options): Instance;
  export default autocannon;
}
