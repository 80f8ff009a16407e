// The little of autocannon's programmatic API the benches use (the package ships no types).
declare module 'autocannon' {
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
  }
  interface Result {
    requests: { average: number; total: number };
    latency: Record<string, number>;
    non2xx: number;
    errors: number;
  }
  interface Instance extends PromiseLike<Result> {
    on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): this;
  }
  function autocannon(options: Options): Instance;
  export default autocannon;
}
