// The few parts of autocannon's API the benchmarks use (the package ships no types).
declare module 'autocannon' {
  interface Request { method?: string; path?: string; headers?: Record<string, string>; body?: string }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    /** Requests per second across all connections. */
    overallRate?: number;
    headers?: Record<string, string>;
    requests?: Array<{ method?: string; setupRequest?: (req: Request) => Request }>;
  }
  interface Result { requests: { average: number; total: number }; latency: { p99: number }; non2xx: number; errors: number; '2xx': number }
  export type { Result };
  export default function autocannon(o: Options, cb: (err: Error | null, r: Result) => void): unknown;
}
