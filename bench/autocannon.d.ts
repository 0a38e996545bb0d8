// The part of autocannon 9's programmatic API the benchmarks use (it ships no type declarations).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  export interface Client extends EventEmitter {
    setBody(body: string | Buffer): void;
    on(event: 'response', listener: (statusCode: number, resBytes: number, responseTimeMs: number) => void): this;
    on(event: 'body', listener: (chunk: Buffer) => void): this;
    on(event: string, listener: (...args: any[]) => void): this;
  }

  export interface Options {
    url: string;
    connections?: number;
    duration?: number;
    timeout?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
    setupClient?: (client: Client) => void;
    /** onResponse receives the whole response body. */
    requests?: { onResponse?: (status: number, body: string, context: Record<string, unknown>) => void }[];
  }

  export interface Histogram {
    average: number;
    mean: number;
    min: number;
    max: number;
    p50: number;
    p90: number;
    p97_5: number;
    p99: number;
    total: number;
  }

  export interface Result {
    requests: Histogram;
    latency: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
    statusCodeStats: Record<string, { count: number }>;
  }

  function autocannon(opts: Options): Promise<Result> & EventEmitter;
  export default autocannon;
}
