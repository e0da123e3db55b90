// autocannon 8 ships no type declarations; this covers the part of its programmatic API the benchmarks use.
declare module 'autocannon' {
  namespace autocannon {
    interface Request {
      method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
      path?: string;
      headers?: Record<string, string>;
      body?: string;
      setupRequest?: (req: Request, context: Record<string, string>) => Request;
    }
    interface Options {
      url: string;
      duration?: number;
      connections?: number;
      overallRate?: number;
      headers?: Record<string, string>;
      requests?: Request[];
    }
    interface Histogram {
      average: number;
      p50: number;
      p90: number;
      p99: number;
      max: number;
    }
    interface Result {
      requests: Histogram & { total: number };
      latency: Histogram;
      errors: number;
      timeouts: number;
      non2xx: number;
    }
  }
  function autocannon(options: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
