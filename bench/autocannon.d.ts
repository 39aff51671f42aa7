// The parts of autocannon 9 that bench/load.ts uses (the package ships no types).
declare module 'autocannon' {
  namespace autocannon {
    interface Request { method?: string, path?: string, headers?: Record<string, string>, body?: string, setupRequest?: (req: Request) => Request }
    interface Options { url?: string, duration?: number, amount?: number, connections?: number, headers?: Record<string, string>, requests?: Request[] }
    interface Histogram { average: number, p50: number, p99: number, total: number }
    interface Result { requests: Histogram, latency: Histogram, throughput: Histogram, errors: number, timeouts: number }
  }
  function autocannon(opts: autocannon.Options): Promise<autocannon.Result>
  export default autocannon
}
