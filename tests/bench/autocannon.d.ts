/** The part of the load generator's API that tests/bench uses (the package ships no types). */
declare module 'autocannon' {
  export interface Options {
    url: string;
    connections?: number;
    duration?: number;
    pipelining?: number;
    method?: string;
    headers?: Record<string, string>;
    timeout?: number;
    /** cycled per connection; each may rewrite itself before it is sent */
    requests?: RequestSpec[];
  }

  export interface RequestSpec {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    setupRequest?: (req: RequestSpec) => RequestSpec;
    onResponse?: (status: number, body: string) => void;
  }

  export interface Stats {
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

  export interface Result {
    url: string;
    requests: Stats & { sent: number };
    latency: Stats;
    throughput: Stats;
    errors: number;
    timeouts: number;
    non2xx: number;
    '2xx': number;
    duration: number;
    connections: number;
  }

  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
