// The part of autocannon 9's programmatic API the benches use (the package ships no types).
declare module 'autocannon' {
  interface Histogram {
    average: number;
    mean: number;
    p50: number;
    p90: number;
    p99: number;
    max: number;
  }
  interface Result {
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    '2xx': number;
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    headers?: Record<string, string>;
  }
  function autocannon(options: Options): Promise<Result>;
  export default autocannon;
}
