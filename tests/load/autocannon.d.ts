// The part of autocannon 9's API the load run uses (the package ships no types).
declare module "autocannon" {
  import type { EventEmitter } from "node:events";

  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    pipelining?: number;
    timeout?: number;
    headers?: Record<string, string>;
  }
  interface Result {
    requests: { total: number };
    errors: number;
    timeouts: number;
    non2xx: number;
    statusCodeStats?: Record<string, { count: number }>;
  }
  interface Instance extends EventEmitter, PromiseLike<Result> {
    stop(): void;
  }
  function autocannon(options: Options): Instance;
  export default autocannon;
  export type { Instance, Options, Result };
}
