// The part of autocannon 9's programmatic API the load benchmark uses (the package ships no types).
declare module 'autocannon' {
  export interface RequestContext {
    [key: string]: unknown;
  }
  export interface RequestParams {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
  }
  export interface Request extends RequestParams {
    setupRequest?: (request: RequestParams, context: RequestContext) => RequestParams;
    onResponse?: (status: number, body: string, context: RequestContext) => void;
  }
  export interface Options extends RequestParams {
    url: string;
    connections?: number;
    duration?: number;
    timeout?: number;
    requests?: Request[];
  }
  export interface Histogram {
    average: number;
    mean: number;
    p50: number;
    p99: number;
    max: number;
  }
  export interface Result {
    requests: Histogram & { total: number };
    latency: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    '2xx': number;
    statusCodeStats: Record<string, { count: number }>;
    duration: number;
  }
  export interface Instance extends Promise<Result> {
    stop(): void;
  }
  export default function autocannon(options: Options): Instance;
}
