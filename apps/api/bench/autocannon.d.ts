// The few parts of autocannon 8 the benchmarks use (the package ships no types).
declare module "autocannon" {
  import type { EventEmitter } from "node:events";
  namespace autocannon {
    type RawRequest = { method?: string; path?: string; headers?: Record<string, string>; body?: string };
    type Request = RawRequest & {
      setupRequest?: (req: RawRequest, context: Record<string, unknown>) => RawRequest | null;
      onResponse?: (status: number, body: string, context: Record<string, unknown>) => void;
    };
    type Options = { url: string; connections?: number; connectionRate?: number; duration?: number; timeout?: number; requests?: Request[] };
    type Result = { errors: number; timeouts: number; non2xx: number; requests: { total: number } };
    type Instance = EventEmitter;
  }
  function autocannon(options: autocannon.Options): autocannon.Instance;
  export default autocannon;
}
