// The part of autocannon's programmatic API the load run uses (the package ships no types).
declare module 'autocannon' {
  interface Stats { total: number; average: number; mean: number; p50: number; p99: number }
  export interface Result {
    requests: Stats;
    latency: Stats;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
  }
  interface Instance extends PromiseLike<Result> {
    on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): this;
    stop(): void;
  }
  function autocannon(options: Record<string, unknown>): Instance;
  export default autocannon;
}
