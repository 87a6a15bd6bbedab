/** The part of autocannon's API the bench uses (the package ships no types and @types/autocannon is not installed). */
declare module "autocannon" {
  namespace autocannon {
    interface Request {
      method?: string;
      path?: string;
      headers?: Record<string, string>;
      body?: string;
      setupRequest?: (req: Request) => Request;
    }
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      pipelining?: number;
      requests?: Request[];
    }
    interface Result {
      requests: { average: number; total: number };
      latency: { p99: number; average: number };
      non2xx: number;
      errors: number;
      timeouts: number;
    }
  }
  function autocannon(opts: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
