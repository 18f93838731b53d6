// The part of autocannon 9's programmatic API the benchmarks use (the package ships no type declarations).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';
  namespace autocannon {
    interface Options {
      url: string;
      connections?: number;
      duration?: number;
      headers?: Record<string, string>;
      timeout?: number;
    }
    interface Result {
      duration: number;
      errors: number;
      timeouts: number;
      non2xx: number;
      requests: { total: number; average: number };
    }
  }
  function autocannon(options: autocannon.Options, done: (error: Error | null, result: autocannon.Result) => void): EventEmitter;
  export default autocannon;
}
