/** The part of autocannon's API the benchmarks use (the package ships no types). */
declare module 'autocannon' {
  interface Histogram { average: number, p50: number, p99: number }
  interface Result { requests: Histogram, latency: Histogram, non2xx: number, errors: number, timeouts: number }
  interface Options { url: string, method?: string, connections?: number, duration?: number, headers?: Record<string, string>, body?: string, pipelining?: number, requests?: { setupRequest?: (request: Record<string, unknown>) => Record<string, unknown> }[] }
  function autocannon(options: Options, callback: (error: Error | null, result: Result) => void): unknown
  export default autocannon
}
